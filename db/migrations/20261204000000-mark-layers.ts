import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationParams } from 'umzug';

/**
 * One mark layer per photograph: the marks and reviewers' comments as one JSONB document (the
 * schema lives in src/lib/marks/schema.ts, with its own schemaVersion), replaced whole on each save
 * under optimistic locking by `version`. Once the photo's check is approved the database refuses
 * any change to its layer, as it does for the check itself.
 */
type Ctx = MigrationParams<QueryInterface>;

export async function up({ context: qi }: Ctx): Promise<void> {
	await qi.sequelize.transaction(async (transaction) => {
		const o = { transaction };
		await qi.createTable(
			'mark_layers',
			{
				photo_id: { type: DataTypes.UUID, primaryKey: true, references: { model: 'photos', key: 'id' }, onDelete: 'RESTRICT' },
				layer: { type: DataTypes.JSONB, allowNull: false },
				mark_count: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
				version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
				updated_by: { type: DataTypes.UUID, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'RESTRICT' },
				created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: qi.sequelize.literal('CURRENT_TIMESTAMP') },
				updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: qi.sequelize.literal('CURRENT_TIMESTAMP') },
			},
			o,
		);
		await qi.sequelize.query(
			`ALTER TABLE mark_layers ADD CONSTRAINT mark_layers_version_check CHECK (version >= 0 AND mark_count >= 0);
			 CREATE FUNCTION mark_layers_frozen() RETURNS trigger AS $$
			 BEGIN
			   -- The demo seeder writes the marks of checks it creates already approved (SET LOCAL).
			   IF current_setting('meniscus.seeding', true) = 'on' THEN RETURN COALESCE(NEW, OLD); END IF;
			   IF EXISTS (SELECT 1 FROM photos p JOIN condition_checks c ON c.id = p.check_id
			              WHERE p.id = COALESCE(NEW.photo_id, OLD.photo_id) AND c.state = 'approved') THEN
			     RAISE EXCEPTION 'the marks of a photograph in an approved check cannot be changed';
			   END IF;
			   RETURN COALESCE(NEW, OLD);
			 END $$ LANGUAGE plpgsql;
			 CREATE TRIGGER mark_layers_frozen BEFORE INSERT OR UPDATE OR DELETE ON mark_layers
			   FOR EACH ROW EXECUTE FUNCTION mark_layers_frozen();`,
			o,
		);
	});
}

export async function down({ context: qi }: Ctx): Promise<void> {
	await qi.sequelize.transaction(async (transaction) => {
		await qi.dropTable('mark_layers', { transaction });
		await qi.sequelize.query('DROP FUNCTION IF EXISTS mark_layers_frozen()', { transaction });
	});
}
