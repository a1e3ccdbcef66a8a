import { Op } from 'sequelize';
import { db } from '../db.ts';
import { config } from '../config.ts';
import { User } from '../models/index.ts';
import { audit } from '../audit.ts';
import { consumeToken, issueToken } from '../auth/tokens.ts';
import { hashPassword } from '../auth/password.ts';
import { endAllSessions } from '../auth/lucia.ts';
import { forgetDevices } from '../auth/devices.ts';
import { enqueueMail } from '../mail/outbox.ts';
import { invitationMail, resetMail } from '../mail/templates.ts';
import { passwordProblems, type PasswordProblem } from '../../auth/passwordPolicy.ts';
import type { Role } from '../../auth/roles.ts';
import { userView } from './presenter.ts';

/**
 * Account changes an administrator makes, and the e-mailed invitation and reset links. Each change
 * commits together with its audit event and its e-mail (outbox), or not at all.
 */
export class AccountError extends Error {
	constructor(
		readonly status: 400 | 404 | 409,
		message: string,
	) {
		super(message);
	}
}

interface Actor {
	id: string;
	clientAddress: string | null;
}

const tokenTtlMs = () => config().MENISCUS_TOKEN_HOURS * 3_600_000;

export async function createUser(actor: Actor, input: { email: string; name: string; role: Role }, origin: string) {
	return db().transaction(async (transaction) => {
		if (await User.findOne({ where: { email: input.email }, transaction })) {
			throw new AccountError(409, 'A user with that e-mail address exists already.');
		}
		const user = await User.create({ ...input, passwordHash: null, lastSignInAt: null }, { transaction });
		const token = await issueToken(user.id, 'invite', tokenTtlMs(), transaction);
		await enqueueMail(
			invitationMail(user.email, user.name, `${origin}/reset/${token}`, config().MENISCUS_TOKEN_HOURS),
			transaction,
		);
		await audit(
			{ action: 'user.create', entityType: 'user', entityId: user.id, actorId: actor.id, after: userView(user), clientAddress: actor.clientAddress },
			transaction,
		);
		return userView(user);
	});
}

export async function resendInvitation(actor: Actor, userId: string, origin: string) {
	return db().transaction(async (transaction) => {
		const user = await User.findByPk(userId, { transaction });
		if (!user) throw new AccountError(404, 'No such user.');
		if (user.passwordHash) throw new AccountError(409, 'This user has set a password already; they can use “Forgot your password?”.');
		const token = await issueToken(user.id, 'invite', tokenTtlMs(), transaction);
		await enqueueMail(invitationMail(user.email, user.name, `${origin}/reset/${token}`, config().MENISCUS_TOKEN_HOURS), transaction);
		await audit({ action: 'user.invite', entityType: 'user', entityId: user.id, actorId: actor.id, clientAddress: actor.clientAddress }, transaction);
	});
}

export async function updateUser(
	actor: Actor,
	userId: string,
	patch: { name?: string; role?: Role; disabled?: boolean },
) {
	const result = await db().transaction(async (transaction) => {
		const user = await User.findByPk(userId, { transaction, lock: transaction.LOCK.UPDATE });
		if (!user) throw new AccountError(404, 'No such user.');
		const before = userView(user);
		if (user.id === actor.id && (patch.disabled === true || (patch.role && patch.role !== 'admin'))) {
			throw new AccountError(409, 'You cannot disable your own account or remove your own administrator role.');
		}
		const losesAdmin = user.role === 'admin' && ((patch.role && patch.role !== 'admin') || patch.disabled === true);
		if (losesAdmin) {
			const admins = await User.count({ where: { role: 'admin', disabled: false, id: { [Op.ne]: user.id } }, transaction });
			if (admins === 0) throw new AccountError(409, 'Meniscus needs at least one active administrator.');
		}
		user.set(patch);
		await user.save({ transaction });
		const after = userView(user);
		await audit({ action: 'user.update', entityType: 'user', entityId: user.id, actorId: actor.id, before, after, clientAddress: actor.clientAddress }, transaction);
		return { view: after, endSessions: patch.disabled === true };
	});
	// Role changes apply on the next request anyway (the role is read per request); a disabled
	// account also loses its sessions and remembered browsers at once.
	if (result.endSessions) {
		await endAllSessions(userId);
		await forgetDevices(userId);
	}
	return result.view;
}

/** Always the same outcome for the caller, whether or not the address has an account. */
export async function requestPasswordReset(email: string, origin: string, clientAddress: string | null): Promise<void> {
	await db().transaction(async (transaction) => {
		const user = await User.findOne({ where: { email }, transaction });
		if (!user || user.disabled) {
			await audit({ action: 'password.reset-request-ignored', entityType: 'user', entityId: user?.id ?? null, after: { email }, clientAddress }, transaction);
			return;
		}
		const token = await issueToken(user.id, 'reset', tokenTtlMs(), transaction);
		await enqueueMail(resetMail(user.email, user.name, `${origin}/reset/${token}`, config().MENISCUS_TOKEN_HOURS), transaction);
		await audit({ action: 'password.reset-request', entityType: 'user', entityId: user.id, clientAddress }, transaction);
	});
}

export type SetPasswordResult = { ok: true; userId: string } | { ok: false; problems: PasswordProblem[] } | { ok: false; invalidToken: true };

/** Sets a password through an invitation or reset link; the link is used up only on success. */
export async function setPasswordWithToken(
	token: string,
	password: string,
	clientAddress: string | null,
	now = new Date(),
): Promise<SetPasswordResult> {
	const result = await db().transaction(async (transaction): Promise<SetPasswordResult> => {
		const used = await consumeToken(token, transaction, now);
		if (!used) return { ok: false, invalidToken: true };
		const user = await User.findByPk(used.userId, { transaction });
		if (!user || user.disabled) return { ok: false, invalidToken: true };
		const problems = passwordProblems(password, { email: user.email, name: user.name });
		if (problems.length) {
			// Roll back so the link stays usable for a second try.
			throw new PasswordRefused(problems);
		}
		user.passwordHash = await hashPassword(password);
		await user.save({ transaction });
		await audit({ action: `password.set-by-${used.purpose}`, entityType: 'user', entityId: user.id, actorId: user.id, clientAddress }, transaction);
		return { ok: true, userId: user.id };
	}).catch((err) => {
		if (err instanceof PasswordRefused) return { ok: false as const, problems: err.problems };
		throw err;
	});
	// Whoever held the old password is signed out everywhere, and no browser stays trusted.
	if (result.ok) {
		await endAllSessions(result.userId);
		await forgetDevices(result.userId);
	}
	return result;
}

class PasswordRefused extends Error {
	constructor(readonly problems: PasswordProblem[]) {
		super('password refused');
	}
}
