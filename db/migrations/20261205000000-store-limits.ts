import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationParams } from 'umzug';

/**
 * What a store allows and how warm it gets: a flammable volume limit in litres (null: not set), the
 * share of it at which the overview warns that the store is near its limit (80 % unless the
 * administrator says otherwise; common practice, no published source), and the expected temperature
 * range in °C (null: not known). The range is bounded to −20…+40 °C, where the OIML R 22 formula the
 * airspace check uses holds. The limit itself is the organisation's own, from its local fire code.
 */
type Ctx = MigrationParams<QueryInterface>;

export async function up({ context: qi }: Ctx): Promise<void> {
	await qi.sequelize.transaction(async (transaction) => {
		const o = { transaction };
		await qi.addColumn('storage_locations', 'flammable_limit_l', { type: DataTypes.DECIMAL(9, 1), allowNull: true }, o);
		await qi.addColumn('storage_locations', 'near_limit_percent', { type: DataTypes.SMALLINT, allowNull: false, defaultValue: 80 }, o);
		await qi.addColumn('storage_locations', 'temp_min_c', { type: DataTypes.DECIMAL(4, 1), allowNull: true }, o);
		await qi.addColumn('storage_locations', 'temp_max_c', { type: DataTypes.DECIMAL(4, 1), allowNull: true }, o);
		await qi.sequelize.query(
			`ALTER TABLE storage_locations
			 ADD CONSTRAINT storage_locations_limit_check CHECK (flammable_limit_l IS NULL OR flammable_limit_l > 0),
			 ADD CONSTRAINT storage_locations_near_check CHECK (near_limit_percent BETWEEN 1 AND 100),
			 ADD CONSTRAINT storage_locations_temp_check CHECK (
			   (temp_min_c IS NULL OR temp_min_c BETWEEN -20 AND 40) AND (temp_max_c IS NULL OR temp_max_c BETWEEN -20 AND 40)
			   AND (temp_min_c IS NULL OR temp_max_c IS NULL OR temp_min_c <= temp_max_c))`,
			o,
		);
	});
}

export async function down({ context: qi }: Ctx): Promise<void> {
	await qi.sequelize.transaction(async (transaction) => {
		for (const c of ['temp_max_c', 'temp_min_c', 'near_limit_percent', 'flammable_limit_l']) await qi.removeColumn('storage_locations', c, { transaction });
	});
}
