import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationParams } from 'umzug';

/**
 * The height of the top of the specimen above the jar's inner base, in mm, as measured on the jar
 * (null: not measured). The fluid level is measured from the same base, so the two together say how
 * much fluid stands over the specimen, and the level trend says when it would be exposed.
 */
type Ctx = MigrationParams<QueryInterface>;

export async function up({ context: qi }: Ctx): Promise<void> {
	await qi.sequelize.transaction(async (transaction) => {
		await qi.addColumn('specimens', 'specimen_top_mm', { type: DataTypes.DECIMAL(7, 1), allowNull: true }, { transaction });
		await qi.sequelize.query(
			`ALTER TABLE specimens ADD CONSTRAINT specimens_top_check CHECK (specimen_top_mm IS NULL OR (specimen_top_mm > 0 AND specimen_top_mm <= inner_height_mm))`,
			{ transaction },
		);
	});
}

export async function down({ context: qi }: Ctx): Promise<void> {
	await qi.sequelize.transaction(async (transaction) => {
		await qi.removeColumn('specimens', 'specimen_top_mm', { transaction });
	});
}
