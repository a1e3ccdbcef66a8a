import { QueryTypes, type Transaction } from 'sequelize';
import { db } from '../db.ts';
import { MailPreference } from '../models/index.ts';
import { audit } from '../audit.ts';
import { DEFAULT_MAIL_PREFERENCES, MAIL_KINDS, type MailKind, type MailPreferences, type MailPreferencesPatch } from '../../mail/preferences.ts';

/** Who wants which optional mail. No row means the defaults (everything on). */
const present = (row: MailPreference | null): MailPreferences =>
	row ? Object.fromEntries(MAIL_KINDS.map((k) => [k, row[k]])) as MailPreferences : { ...DEFAULT_MAIL_PREFERENCES };

export async function mailPreferences(userId: string): Promise<MailPreferences> {
	return present(await MailPreference.findByPk(userId));
}

/** The users among `userIds` who have not turned `kind` off. */
export async function wanting(kind: MailKind, userIds: string[], transaction?: Transaction): Promise<Set<string>> {
	const off = await MailPreference.findAll({ where: { userId: userIds, [kind]: false }, attributes: ['userId'], transaction });
	const no = new Set(off.map((r) => r.userId));
	return new Set(userIds.filter((id) => !no.has(id)));
}

/** Changes one's own choices, audited in the same transaction; returns them all. */
export async function updateMailPreferences(actor: { id: string; clientAddress: string | null }, patch: MailPreferencesPatch): Promise<MailPreferences> {
	return db().transaction(async (transaction) => {
		// Make the row if missing, then lock it: two tabs saving at once change it one after the other.
		await db().query('INSERT INTO mail_preferences (user_id) VALUES (:id) ON CONFLICT (user_id) DO NOTHING', { replacements: { id: actor.id }, type: QueryTypes.INSERT, transaction });
		const row = (await MailPreference.findByPk(actor.id, { transaction, lock: transaction.LOCK.UPDATE }))!;
		const before = present(row);
		row.set(patch);
		await row.save({ transaction });
		const after = present(row);
		await audit({ action: 'user.mail-preferences', entityType: 'user', entityId: actor.id, actorId: actor.id, before, after, clientAddress: actor.clientAddress }, transaction);
		return after;
	});
}
