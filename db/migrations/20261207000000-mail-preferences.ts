import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationParams } from 'umzug';

/**
 * Mail about condition checks (issue 8, "Review and notifications"):
 * - `mail_preferences`: one row per user who changed a choice; no row means every optional mail is on.
 *   Account mail (invitations, resets) has no column here: it is never optional.
 * - `mail_digests`: one row per user per day a due-checks digest was queued, written in the same
 *   transaction as the mail, so a second run or a second worker cannot send that day's digest again.
 * - `outgoing_mail.html_body`: the simple HTML part next to the plain text.
 */
type Ctx = MigrationParams<QueryInterface>;

export async function up({ context: qi }: Ctx): Promise<void> {
	const now = () => ({ type: DataTypes.DATE, allowNull: false, defaultValue: qi.sequelize.literal('CURRENT_TIMESTAMP') });
	const on = () => ({ type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true });
	const user = () => ({ type: DataTypes.UUID, allowNull: false, primaryKey: true, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' });
	// Fresh definitions per column: Sequelize writes into the objects it is given.
	await qi.sequelize.transaction(async (transaction) => {
		const o = { transaction };
		await qi.createTable(
			'mail_preferences',
			{ user_id: user(), check_submitted: on(), check_returned: on(), check_approved: on(), due_digest: on(), updated_at: now() },
			o,
		);
		await qi.createTable(
			'mail_digests',
			{ user_id: user(), digest_date: { type: DataTypes.DATEONLY, allowNull: false, primaryKey: true }, created_at: now() },
			o,
		);
		await qi.addColumn('outgoing_mail', 'html_body', { type: DataTypes.TEXT, allowNull: true }, o);
	});
}

export async function down({ context: qi }: Ctx): Promise<void> {
	await qi.sequelize.transaction(async (transaction) => {
		await qi.removeColumn('outgoing_mail', 'html_body', { transaction });
		await qi.dropTable('mail_digests', { transaction });
		await qi.dropTable('mail_preferences', { transaction });
	});
}
