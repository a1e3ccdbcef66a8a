import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationParams } from 'umzug';

/**
 * Condition checks (never overwritten: an approved check is immutable and a correction is a new
 * check pointing to it), the damage vocabulary the administrator extends, the check intervals per
 * grade, and on each specimen the condition its latest approved check found.
 */
type Ctx = MigrationParams<QueryInterface>;

export async function up({ context: qi }: Ctx): Promise<void> {
	const now = { type: DataTypes.DATE, allowNull: false, defaultValue: qi.sequelize.literal('CURRENT_TIMESTAMP') };
	const uuid = { type: DataTypes.UUID, primaryKey: true, defaultValue: qi.sequelize.literal('gen_random_uuid()') };
	const user = (allowNull: boolean) => ({ type: DataTypes.UUID, allowNull, references: { model: 'users', key: 'id' }, onDelete: 'RESTRICT' });
	await qi.sequelize.transaction(async (transaction) => {
		const o = { transaction };
		await qi.createTable(
			'condition_checks',
			{
				id: uuid,
				specimen_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'specimens', key: 'id' }, onDelete: 'RESTRICT' },
				checked_on: { type: DataTypes.DATEONLY, allowNull: false },
				examiner_id: user(false),
				reason: { type: DataTypes.STRING(20), allowNull: false },
				state: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'draft' },
				parts: { type: DataTypes.JSONB, allowNull: false },
				overall_grade: { type: DataTypes.STRING(12), allowNull: true },
				overall_override_reason: { type: DataTypes.TEXT, allowNull: true },
				priority: { type: DataTypes.STRING(8), allowNull: true },
				next_check_due: { type: DataTypes.DATEONLY, allowNull: true },
				notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
				fluid: { type: DataTypes.JSONB, allowNull: true },
				corrects_check_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'condition_checks', key: 'id' }, onDelete: 'RESTRICT' },
				submitted_at: { type: DataTypes.DATE, allowNull: true },
				reviewer_id: user(true),
				reviewed_at: { type: DataTypes.DATE, allowNull: true },
				review_comment: { type: DataTypes.TEXT, allowNull: true },
				version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
				created_at: now,
				updated_at: now,
			},
			o,
		);
		await qi.sequelize.query(
			`ALTER TABLE condition_checks
			 ADD CONSTRAINT checks_state_check CHECK (state IN ('draft','in-review','returned','approved')),
			 ADD CONSTRAINT checks_grade_check CHECK (overall_grade IS NULL OR overall_grade IN ('good','fair','poor','unacceptable')),
			 ADD CONSTRAINT checks_priority_check CHECK (priority IS NULL OR priority IN ('urgent','high','routine','none')),
			 ADD CONSTRAINT checks_reason_check CHECK (reason IN ('routine-survey','before-treatment','after-treatment','loan-out','loan-return','incident')),
			 ADD CONSTRAINT checks_approved_reviewed CHECK (state <> 'approved' OR (reviewer_id IS NOT NULL AND reviewed_at IS NOT NULL)),
			 ADD CONSTRAINT checks_own_review CHECK (reviewer_id IS NULL OR reviewer_id <> examiner_id)`,
			o,
		);
		await qi.addIndex('condition_checks', ['specimen_id', 'checked_on'], o);
		await qi.addIndex('condition_checks', ['state', 'submitted_at'], o);
		await qi.addIndex('condition_checks', ['examiner_id', 'state'], o);
		// The database itself refuses to change an approved check, whatever the application does.
		await qi.sequelize.query(
			`CREATE FUNCTION condition_checks_immutable() RETURNS trigger AS $$
			 BEGIN
			   IF OLD.state = 'approved' THEN RAISE EXCEPTION 'an approved condition check cannot be changed'; END IF;
			   RETURN COALESCE(NEW, OLD);
			 END $$ LANGUAGE plpgsql;
			 CREATE TRIGGER condition_checks_immutable BEFORE UPDATE OR DELETE ON condition_checks
			   FOR EACH ROW EXECUTE FUNCTION condition_checks_immutable();`,
			o,
		);
		await qi.createTable(
			'damage_terms',
			{
				id: uuid,
				part: { type: DataTypes.STRING(12), allowNull: false },
				term: { type: DataTypes.STRING(60), allowNull: false },
				active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
				created_at: now,
				updated_at: now,
			},
			o,
		);
		await qi.addIndex('damage_terms', ['part', 'term'], { ...o, unique: true });
		await qi.createTable(
			'grade_intervals',
			{
				grade: { type: DataTypes.STRING(12), primaryKey: true },
				months: { type: DataTypes.INTEGER, allowNull: false },
				updated_at: now,
			},
			o,
		);
		await qi.sequelize.query(`ALTER TABLE grade_intervals ADD CONSTRAINT grade_intervals_months CHECK (months BETWEEN 1 AND 120)`, o);
		await qi.addColumn('specimens', 'current_grade', { type: DataTypes.STRING(12), allowNull: true }, o);
		await qi.addColumn('specimens', 'current_priority', { type: DataTypes.STRING(8), allowNull: true }, o);
		await qi.addColumn('specimens', 'last_checked_on', { type: DataTypes.DATEONLY, allowNull: true }, o);
	});
}

export async function down({ context: qi }: Ctx): Promise<void> {
	await qi.sequelize.transaction(async (transaction) => {
		const o = { transaction };
		for (const c of ['last_checked_on', 'current_priority', 'current_grade']) await qi.removeColumn('specimens', c, o);
		await qi.dropTable('grade_intervals', o);
		await qi.dropTable('damage_terms', o);
		await qi.dropTable('condition_checks', o);
		await qi.sequelize.query('DROP FUNCTION IF EXISTS condition_checks_immutable()', o);
	});
}
