import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationParams } from 'umzug';

/**
 * Saved comparisons of two photographs of one specimen (issue 7, "Change over time"): the
 * registration's input (model and control points), its transform from the after photo's pixels
 * to the before photo's, and the summary the server computed from the two mark layers when it was
 * saved (src/lib/compare/analysis.ts). The photos and the specimen cannot be deleted under a
 * comparison; `version` guards against lost updates as elsewhere.
 */
type Ctx = MigrationParams<QueryInterface>;

export async function up({ context: qi }: Ctx): Promise<void> {
	const now = { type: DataTypes.DATE, allowNull: false, defaultValue: qi.sequelize.literal('CURRENT_TIMESTAMP') };
	const ref = (model: string) => ({ type: DataTypes.UUID, allowNull: false, references: { model, key: 'id' }, onDelete: 'RESTRICT' });
	await qi.sequelize.transaction(async (transaction) => {
		const o = { transaction };
		await qi.createTable(
			'photo_comparisons',
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: qi.sequelize.literal('gen_random_uuid()') },
				specimen_id: ref('specimens'),
				before_photo_id: ref('photos'),
				after_photo_id: ref('photos'),
				model: { type: DataTypes.STRING(12), allowNull: false },
				control_points: { type: DataTypes.JSONB, allowNull: false, defaultValue: qi.sequelize.literal(`'[]'::jsonb`) },
				// 3 × 3, after-photo px → before-photo px; null when compared unaligned.
				transform: { type: DataTypes.JSONB, allowNull: true },
				summary: { type: DataTypes.JSONB, allowNull: false },
				note: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
				version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
				created_by: ref('users'),
				updated_by: ref('users'),
				created_at: now,
				updated_at: now,
			},
			o,
		);
		await qi.sequelize.query(
			`ALTER TABLE photo_comparisons
			 ADD CONSTRAINT photo_comparisons_two_photos CHECK (before_photo_id <> after_photo_id),
			 ADD CONSTRAINT photo_comparisons_model_check CHECK (model IN ('perspective','affine','none')),
			 ADD CONSTRAINT photo_comparisons_version_check CHECK (version >= 1)`,
			o,
		);
		await qi.addIndex('photo_comparisons', ['specimen_id'], o);
	});
}

export async function down({ context: qi }: Ctx): Promise<void> {
	await qi.sequelize.transaction(async (transaction) => {
		await qi.dropTable('photo_comparisons', { transaction });
	});
}
