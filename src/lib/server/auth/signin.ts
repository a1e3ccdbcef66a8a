import { User } from '../models/index.ts';
import { throttleKeys } from '../../auth/throttlePolicy.ts';
import { verifyAgainstNothing, verifyPassword } from './password.ts';
import { reserveAttempt, settleSuccess } from './throttle.ts';
import { rememberDevice, trustedDevice } from './devices.ts';
import { audit } from '../audit.ts';

/**
 * One sign-in attempt. Unknown address, wrong password, disabled account and an account without a
 * password all give the same answer after the same work (ASVS 6.3.8), and all count towards the
 * throttle of that address, so an attacker learns nothing about who has an account.
 *
 * Throttling without a lockout (ASVS 6.3.1, TESTPLAN L3): an attempt from a browser that signed in to
 * this account before (its device cookie, devices.ts) is counted on that browser alone; every other
 * attempt is counted on the account and on the address. A flood of guesses therefore slows the
 * guesser and new browsers, while the real user's own browser still gets in.
 */
export type SignInResult =
	| { ok: true; userId: string; deviceToken: string }
	| { ok: false; reason: 'invalid' }
	| { ok: false; reason: 'throttled'; waitMs: number };

export async function attemptSignIn(
	email: string,
	password: string,
	clientAddress: string,
	now = new Date(),
	deviceToken?: string,
): Promise<SignInResult> {
	const user = await User.findOne({ where: { email } });
	const device = await trustedDevice(deviceToken, user?.id ?? null, now);
	const keys = throttleKeys(email, clientAddress, device);
	const trusted = device !== null;
	const wait = await reserveAttempt(keys, now);
	if (wait > 0) {
		await audit({ action: 'sign-in.throttled', entityType: 'user', entityId: user?.id ?? null, after: { email, trustedDevice: trusted }, clientAddress });
		return { ok: false, reason: 'throttled', waitMs: wait };
	}
	const ok =
		user?.passwordHash && !user.disabled
			? await verifyPassword(user.passwordHash, password)
			: await verifyAgainstNothing(password);
	if (!ok || !user) {
		// Already counted by reserveAttempt.
		await audit({
			action: 'sign-in.failed',
			entityType: 'user',
			entityId: user?.id ?? null,
			actorId: null,
			after: { email, why: !user ? 'unknown' : user.disabled ? 'disabled' : 'password', trustedDevice: trusted },
			clientAddress,
		});
		return { ok: false, reason: 'invalid' };
	}
	// A trusted browser's success clears its own count only: the account's count of guesses from
	// elsewhere stands until it runs out. The address gets this attempt's charge back.
	await settleSuccess(keys, now);
	user.lastSignInAt = now;
	await user.save();
	const nextDevice = await rememberDevice(user.id, deviceToken, now);
	await audit({ action: 'sign-in', entityType: 'user', entityId: user.id, actorId: user.id, after: { trustedDevice: trusted }, clientAddress });
	return { ok: true, userId: user.id, deviceToken: nextDevice };
}
