import { User } from '../models/index.ts';
import { ACCOUNT_RULE, ADDRESS_RULE, type ThrottleRule } from '../../auth/throttlePolicy.ts';
import { verifyAgainstNothing, verifyPassword } from './password.ts';
import { clearFailures, currentWait, recordFailure } from './throttle.ts';
import { audit } from '../audit.ts';

/**
 * One sign-in attempt. Unknown address, wrong password, disabled account and an account without a
 * password all give the same answer after the same work (ASVS 6.3.8), and all count towards the
 * throttle of that address, so an attacker learns nothing about who has an account.
 */
export type SignInResult =
	| { ok: true; userId: string }
	| { ok: false; reason: 'invalid' }
	| { ok: false; reason: 'throttled'; waitMs: number };

export async function attemptSignIn(
	email: string,
	password: string,
	clientAddress: string,
	now = new Date(),
): Promise<SignInResult> {
	const keys: [string, ThrottleRule][] = [
		[`account:${email}`, ACCOUNT_RULE],
		[`address:${clientAddress}`, ADDRESS_RULE],
	];
	const wait = await currentWait(keys, now);
	if (wait > 0) {
		await audit({ action: 'sign-in.throttled', entityType: 'user', entityId: null, after: { email }, clientAddress });
		return { ok: false, reason: 'throttled', waitMs: wait };
	}
	const user = await User.findOne({ where: { email } });
	const ok =
		user?.passwordHash && !user.disabled
			? await verifyPassword(user.passwordHash, password)
			: await verifyAgainstNothing(password);
	if (!ok || !user) {
		await recordFailure(keys, now);
		await audit({
			action: 'sign-in.failed',
			entityType: 'user',
			entityId: user?.id ?? null,
			actorId: null,
			after: { email, why: !user ? 'unknown' : user.disabled ? 'disabled' : 'password' },
			clientAddress,
		});
		return { ok: false, reason: 'invalid' };
	}
	await clearFailures(`account:${email}`);
	user.lastSignInAt = now;
	await user.save();
	await audit({ action: 'sign-in', entityType: 'user', entityId: user.id, actorId: user.id, clientAddress });
	return { ok: true, userId: user.id };
}
