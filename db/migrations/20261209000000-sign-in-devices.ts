import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationParams } from 'umzug';

/**
 * Browsers a user has signed in from (TESTPLAN L3; OWASP "Slow Down Online Guessing Attacks with
 * Device Cookies"). A successful sign-in leaves a random device token in an HttpOnly cookie; only its
 * SHA-256 is kept here. A sign-in that brings a valid token for the same account is throttled on that
 * token alone, so someone guessing a password from elsewhere cannot lock the real user out.
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
	});
}

export async function down({ context: qi }: Ctx): Promise<void> {
	await qi.dropTable('sign_in_devices');
}
