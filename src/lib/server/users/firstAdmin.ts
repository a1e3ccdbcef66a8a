import { QueryTypes } from 'sequelize';
import { db } from '../db.ts';
import { User } from '../models/index.ts';
import { audit } from '../audit.ts';
import { hashPassword } from '../auth/password.ts';
import { passwordProblems, type PasswordProblem } from '../../auth/passwordPolicy.ts';

/**
 * The first administrator of an empty installation (no demo data). Open only while there are no
 * users at all; an advisory lock makes two simultaneous attempts create one account, not two.
 */
export async function needsFirstAdmin(): Promise<boolean> {
	return (await User.count()) === 0;
}

export type FirstAdminResult =
	| { ok: true; userId: string }
	| { ok: false; closed: true }
	| { ok: false; problems: PasswordProblem[] };

export async function createFirstAdmin(input: { email: string; name: string; password: string }, clientAddress: string | null): Promise<FirstAdminResult> {
	const problems = passwordProblems(input.password, input);
	if (problems.length) return { ok: false, problems };
	const passwordHash = await hashPassword(input.password);
	return db().transaction(async (transaction) => {
		await db().query(`SELECT pg_advisory_xact_lock(hashtext('meniscus:first-admin'))`, { type: QueryTypes.SELECT, transaction });
		if ((await User.count({ transaction })) > 0) return { ok: false, closed: true };
		const user = await User.create({ email: input.email, name: input.name, role: 'admin', passwordHash, lastSignInAt: null }, { transaction });
		await audit({ action: 'user.first-admin', entityType: 'user', entityId: user.id, actorId: user.id, after: { email: user.email }, clientAddress }, transaction);
		return { ok: true, userId: user.id };
	});
}
