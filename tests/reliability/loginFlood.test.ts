import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Op, QueryTypes } from 'sequelize';
import { useTestDatabase } from '../helpers/server.ts';
import { makeUser } from '../helpers/users.ts';
import { deviceCookieOf, signInFrom, type SignInAnswer } from '../helpers/signInFrom.ts';
import { db } from '../../src/lib/server/db.ts';
import { LoginThrottle } from '../../src/lib/server/models/index.ts';
import { ACCOUNT_RULE } from '../../src/lib/auth/throttlePolicy.ts';

/**
 * TESTPLAN L3, a login flood (ASVS 5.0 6.3.1 brute-force controls without a lockout DoS, 16.3.1
 * authentication events logged; WSTG ATHN-03): 1,000 wrong passwords for one account from one
 * address, 20 at a time. Pass: the guesses are throttled (only the allowance, plus what was already
 * in flight when the block began, ever reaches a password check); the real user still signs in from
 * their own browser, even from the guesser's address; other accounts are untouched; every attempt is
 * in the audit trail with its address.
 */
const GUESSES = 1_000;
const PARALLEL = 20;
const attacker = '127.0.0.2';
let victim: Awaited<ReturnType<typeof makeUser>>;
let ownBrowser = '';

beforeAll(async () => {
	useTestDatabase();
	db();
	victim = await makeUser('conservator', { tag: 'flood' });
	ownBrowser = deviceCookieOf(await signInFrom(victim.user.email, victim.password));
});

afterAll(async () => {
	await LoginThrottle.destroy({ where: { key: { [Op.in]: [`account:${victim.user.email}`, `address:${attacker}`, 'address:127.0.0.4'] } } });
});

async function flood(): Promise<{ answers: SignInAnswer[]; ms: number }> {
	const answers: SignInAnswer[] = [];
	let next = 0;
	const t0 = performance.now();
	await Promise.all(
		Array.from({ length: PARALLEL }, async () => {
			while (next < GUESSES) {
				const i = next++;
				answers.push(await signInFrom(victim.user.email, `guess ${i} of the flood`, { from: attacker }));
			}
		}),
	);
	return { answers, ms: performance.now() - t0 };
}

describe('a flood of wrong passwords at one account from one address (TESTPLAN L3)', () => {
	it('is throttled, logged whole, and does not keep the real user out', async () => {
		const since = new Date();
		const { answers, ms } = await flood();
		const count = (s: number) => answers.filter((a) => a.status === s).length;
		const checked = count(401);
		const throttled = count(429);
		console.log(`[L3] ${GUESSES} guesses, ${PARALLEL} at a time, in ${(ms / 1000).toFixed(1)} s: ${checked} reached a password check (401), ${throttled} throttled (429)`);
		expect(checked + throttled).toBe(GUESSES);
		expect(answers.every((a) => !a.cookies.meniscus_session)).toBe(true);
		// Exactly the allowance reaches a password check, however many guesses arrive at once: each
		// attempt is charged before its check (the first wait, 30 s, outlasts this flood).
		expect(ms).toBeLessThan(ACCOUNT_RULE.baseDelayMs);
		expect(checked).toBe(ACCOUNT_RULE.free);

		// The real user's own browser gets in, also from the guesser's (shared) address.
		const own = await signInFrom(victim.user.email, victim.password, { cookie: ownBrowser, from: attacker });
		expect(own.status).toBe(303);
		expect(own.cookies.meniscus_session).toBeTruthy();
		// A browser that never signed in to this account waits like the guesser (the price of no
		// lockout for known browsers; a password reset link makes a new browser known).
		expect((await signInFrom(victim.user.email, victim.password, { from: '127.0.0.4' })).status).toBe(429);
		// Another account, from another address, is not affected.
		const other = await makeUser('reviewer', { tag: 'flood-other' });
		expect((await signInFrom(other.user.email, other.password, { from: '127.0.0.4' })).status).toBe(303);

		// Every attempt logged, with its address and its outcome (ASVS 16.3.1).
		const rows = await db().query<{ action: string; client_address: string; n: string }>(
			`SELECT action, client_address, count(*) AS n FROM audit_events
			  WHERE occurred_at >= :since AND after->>'email' = :email AND action IN ('sign-in.failed', 'sign-in.throttled')
			  GROUP BY action, client_address`,
			{ replacements: { since, email: victim.user.email }, type: QueryTypes.SELECT },
		);
		const logged = (action: string) => rows.filter((r) => r.action === action && r.client_address.endsWith(attacker)).reduce((n, r) => n + Number(r.n), 0);
		expect(logged('sign-in.failed')).toBe(checked);
		expect(logged('sign-in.throttled')).toBe(throttled);
		// … and the new browser's attempt from 127.0.0.4 too.
		expect(rows.find((r) => r.client_address.endsWith('127.0.0.4'))).toBeTruthy();
	}, 300_000);
});
