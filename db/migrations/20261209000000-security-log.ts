import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationParams } from 'umzug';

/**
 * Security (issue 9: TESTPLAN L3 and A10).
 *
 * `sign_in_devices`: browsers a user has signed in from (TESTPLAN L3; OWASP "Slow Down Online Guessing Attacks with
 * Device Cookies"). A successful sign-in leaves a random device token in an HttpOnly cookie; only its
 * SHA-256 is kept here. A sign-in that brings a valid token for the same account is throttled on that
 * token alone, so someone guessing a password from elsewhere cannot lock the real user out.
 *
 * `audit_events` becomes append-only (ASVS 5.0 16.4.2, logs protected from change): a trigger refuses
 * UPDATE, DELETE and TRUNCATE. Trimming old events under a retention policy is a database
 * administrator's act (ALTER TABLE … DISABLE TRIGGER), never the app's.
 */
type Ctx = MigrationParams<QueryInterface>;

export async function up({ context: qi }: Ctx): Promise<void> {
	await qi.sequelize.transaction(async (transaction) => {
		await qi.createTable(
			'sign_in_devices',
			{
				token_hash: { type: DataTypes.CHAR(64), primaryKey: true },
				user_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
				created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: qi.sequelize.literal('CURRENT_TIMESTAMP') },
				expires_at: { type: DataTypes.DATE, allowNull: false },
			},
			{ transaction },
		);
		await qi.addIndex('sign_in_devices', ['user_id', 'created_at'], { transaction, name: 'sign_in_devices_user' });
		await qi.sequelize.query(
			`CREATE FUNCTION audit_events_append_only() RETURNS trigger AS $$
			 BEGIN
			   RAISE EXCEPTION 'the audit trail is append-only: % refused', TG_OP;
			 END $$ LANGUAGE plpgsql;
			 CREATE TRIGGER audit_events_append_only BEFORE UPDATE OR DELETE ON audit_events
			   FOR EACH ROW EXECUTE FUNCTION audit_events_append_only();
			 CREATE TRIGGER audit_events_no_truncate BEFORE TRUNCATE ON audit_events
			   FOR EACH STATEMENT EXECUTE FUNCTION audit_events_append_only();`,
			{ transaction },
		);
		// The security log reads by action, newest first.
		await qi.addIndex('audit_events', ['action', 'id'], { transaction, name: 'audit_events_action_id' });
	});
}

export async function down({ context: qi }: Ctx): Promise<void> {
	await qi.sequelize.transaction(async (transaction) => {
		await qi.removeIndex('audit_events', 'audit_events_action_id', { transaction });
		await qi.sequelize.query(
			`DROP TRIGGER audit_events_no_truncate ON audit_events;
			 DROP TRIGGER audit_events_append_only ON audit_events;
			 DROP FUNCTION audit_events_append_only();`,
			{ transaction },
		);
		await qi.dropTable('sign_in_devices', { transaction });
	});
}
