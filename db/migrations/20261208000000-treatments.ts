import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationParams } from 'umzug';

/**
 * Treatments and their risk assessments (issue 8, "Treatment"):
 * - `treatment_materials`: the organisation's list of sealants, threads and other materials, kept
 *   by the administrator, with each sealant's cure period (the cure timers read it). Starts with
 *   two silicones at 24 h: "at least overnight before disturbing" is common practice, no published
 *   source (TRADE.md [S15]); the organisation changes the figures to its own.
 * - `treatments`: one per piece of work on a specimen, linking its before- and after-treatment
 *   checks; the plan (steps) and the risk assessment as JSONB, validated by src/lib/treatment/schema.ts;
 *   the assessment's sign-off in columns. A completed or abandoned treatment cannot be changed or
 *   deleted (the database refuses it too, as for approved checks).
 * - two more optional mails: a risk assessment waiting (reviewers), and its sign-off or return (author).
 */
type Ctx = MigrationParams<QueryInterface>;

export async function up({ context: qi }: Ctx): Promise<void> {
	const now = () => ({ type: DataTypes.DATE, allowNull: false, defaultValue: qi.sequelize.literal('CURRENT_TIMESTAMP') });
	const ref = (model: string, allowNull = false) => ({ type: DataTypes.UUID, allowNull, references: { model, key: 'id' }, onDelete: 'RESTRICT' });
	const on = () => ({ type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true });
	await qi.sequelize.transaction(async (transaction) => {
		const o = { transaction };
		await qi.createTable(
			'treatment_materials',
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: qi.sequelize.literal('gen_random_uuid()') },
				kind: { type: DataTypes.STRING(12), allowNull: false },
				name: { type: DataTypes.STRING(200), allowNull: false },
				cure_hours: { type: DataTypes.DECIMAL(7, 2), allowNull: true },
				note: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
				active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
				created_at: now(),
				updated_at: now(),
			},
			o,
		);
		await qi.sequelize.query(
			`ALTER TABLE treatment_materials
			 ADD CONSTRAINT treatment_materials_kind_check CHECK (kind IN ('sealant','thread','fluid','other')),
			 ADD CONSTRAINT treatment_materials_cure_check CHECK (cure_hours IS NULL OR (cure_hours >= 0 AND cure_hours <= 2160));
			 CREATE UNIQUE INDEX treatment_materials_kind_name ON treatment_materials (kind, lower(name));
			 INSERT INTO treatment_materials (kind, name, cure_hours, note) VALUES
			   ('sealant', 'Neutral-cure silicone sealant', 24, 'At least overnight before disturbing: common practice, no published source. Replace with your own figure.'),
			   ('sealant', 'Acid-cure silicone sealant', 24, 'Gives off acetic acid for days to weeks; neutral-cure is preferred near specimens.'),
			   ('thread', 'Polyester thread', NULL, ''),
			   ('other', 'White spirit (cleaning)', NULL, 'Flammable solvent.')`,
			o,
		);
		await qi.createTable(
			'treatments',
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: qi.sequelize.literal('gen_random_uuid()') },
				specimen_id: ref('specimens'),
				title: { type: DataTypes.STRING(200), allowNull: false },
				purpose: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
				before_check_id: ref('condition_checks', true),
				after_check_id: ref('condition_checks', true),
				state: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'planning' },
				steps: { type: DataTypes.JSONB, allowNull: false },
				risk: { type: DataTypes.JSONB, allowNull: false },
				risk_state: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'draft' },
				risk_submitted_at: { type: DataTypes.DATE, allowNull: true },
				risk_reviewer_id: ref('users', true),
				risk_reviewed_at: { type: DataTypes.DATE, allowNull: true },
				risk_review_comment: { type: DataTypes.TEXT, allowNull: true },
				completed_at: { type: DataTypes.DATE, allowNull: true },
				created_by: ref('users'),
				updated_by: ref('users'),
				version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
				created_at: now(),
				updated_at: now(),
			},
			o,
		);
		await qi.sequelize.query(
			`ALTER TABLE treatments
			 ADD CONSTRAINT treatments_state_check CHECK (state IN ('planning','in-progress','completed','abandoned')),
			 ADD CONSTRAINT treatments_risk_state_check CHECK (risk_state IN ('draft','in-review','signed-off','returned')),
			 ADD CONSTRAINT treatments_steps_array CHECK (jsonb_typeof(steps) = 'array'),
			 ADD CONSTRAINT treatments_risk_object CHECK (jsonb_typeof(risk) = 'object'),
			 ADD CONSTRAINT treatments_signed_off_by CHECK (risk_state <> 'signed-off' OR risk_reviewer_id IS NOT NULL);
			 CREATE INDEX treatments_specimen ON treatments (specimen_id);
			 CREATE INDEX treatments_risk_queue ON treatments (risk_submitted_at) WHERE risk_state = 'in-review';
			 CREATE FUNCTION treatments_closed() RETURNS trigger AS $$
			 BEGIN
			   IF OLD.state IN ('completed','abandoned') THEN RAISE EXCEPTION 'a completed or abandoned treatment cannot be changed'; END IF;
			   IF TG_OP = 'DELETE' THEN RETURN OLD; END IF;
			   RETURN NEW;
			 END $$ LANGUAGE plpgsql;
			 CREATE TRIGGER treatments_closed BEFORE UPDATE OR DELETE ON treatments
			   FOR EACH ROW EXECUTE FUNCTION treatments_closed();`,
			o,
		);
		await qi.addColumn('mail_preferences', 'risk_submitted', on(), o);
		await qi.addColumn('mail_preferences', 'risk_reviewed', on(), o);
	});
}

export async function down({ context: qi }: Ctx): Promise<void> {
	await qi.sequelize.transaction(async (transaction) => {
		const o = { transaction };
		await qi.removeColumn('mail_preferences', 'risk_reviewed', o);
		await qi.removeColumn('mail_preferences', 'risk_submitted', o);
		await qi.dropTable('treatments', o);
		await qi.sequelize.query('DROP FUNCTION IF EXISTS treatments_closed()', o);
		await qi.dropTable('treatment_materials', o);
	});
}
