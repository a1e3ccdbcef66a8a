import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { call, sessionCookie, signIn, useTestDatabase } from '../helpers/server.ts';
import { cookieFor, makeUser, signedInUser } from '../helpers/users.ts';
import { deviceCookieOf, signInFrom } from '../helpers/signInFrom.ts';
import { db } from '../../src/lib/server/db.ts';
import { LoginThrottle, SignInDevice, UserSession } from '../../src/lib/server/models/index.ts';
import { attemptSignIn } from '../../src/lib/server/auth/signin.ts';
import { issueToken } from '../../src/lib/server/auth/tokens.ts';

/** Sign-in through the real /login form of the built server, against the real database. */
const errorText = async (res: Response) => (await res.text()).match(/role="alert"[^>]*>([^<]*)</)?.[1] ?? '';

beforeAll(() => {
	useTestDatabase();
	db();
});
afterAll(async () => {
	// Failures from 127.0.0.1 count towards its address throttle; leave none for other test files.
	await LoginThrottle.destroy({ where: { key: 'address:127.0.0.1' } });
});

describe('signing in', () => {
	it('signs in with the right password: a 303 to the next page and an HttpOnly, SameSite=Lax cookie', async () => {
		const { user, password } = await makeUser('curator');
		const res = await call('/login', { form: { email: user.email, password, next: '/admin/users' } });
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe('/admin/users');
		const set = res.headers.getSetCookie().filter((c) => c.startsWith('meniscus_session=')).join('\n');
		expect(set).toMatch(/HttpOnly/i);
		expect(set).toMatch(/SameSite=Lax/i);
		expect(set).toMatch(/Path=\//i);
		// A browser-session cookie: the server's idle and absolute limits decide how long it works.
		expect(set).not.toMatch(/Max-Age|Expires/i);
		const home = await call('/', { cookie: sessionCookie(res)! });
		expect(home.status).toBe(200);
	});

	it('gives a wrong password and an unknown address the same status and the same words', async () => {
		const { user } = await makeUser('conservator');
		const wrong = await call('/login', { form: { email: user.email, password: 'not the password at all' } });
		const unknown = await call('/login', { form: { email: 'nobody-here@example.org', password: 'not the password at all' } });
		expect(wrong.status).toBe(401);
		expect(unknown.status).toBe(401);
		const [a, b] = [await errorText(wrong), await errorText(unknown)];
		expect(a).toBe('That e-mail address and password do not match an active account.');
		expect(b).toBe(a);
		expect(sessionCookie(wrong)).toBeNull();
	});

	it('spends an Argon2id verification on an unknown address too (no timing shortcut)', async () => {
		// A coarse guard, not a performance target: an unknown address must cost an Argon2id
		// verification too. Without it the unknown case is over ten times faster.
		const { user } = await makeUser('conservator');
		const time = async (email: string) => {
			const t = performance.now();
			await attemptSignIn(email, 'wrong password here', '198.51.100.7');
			return performance.now() - t;
		};
		const known: number[] = [];
		const unknown: number[] = [];
		for (let i = 0; i < 4; i++) {
			known.push(await time(user.email));
			unknown.push(await time(`absent-${i}@example.org`));
		}
		const median = (xs: number[]) => xs.sort((p, q) => p - q)[Math.floor(xs.length / 2)]!;
		expect(median(unknown)).toBeGreaterThan(median(known) * 0.4);
		await LoginThrottle.destroy({ where: { key: 'address:198.51.100.7' } });
	});

	it('throttles an account after five failures, even for the right password, with a clear message', async () => {
		const { user, password } = await makeUser('reviewer');
		for (let i = 0; i < 5; i++) {
			expect((await call('/login', { form: { email: user.email, password: `wrong-${i}-password` } })).status).toBe(401);
		}
		const sixth = await call('/login', { form: { email: user.email, password: 'wrong-6-password' } });
		expect(sixth.status).toBe(429);
		expect(await errorText(sixth)).toMatch(/Too many sign-in attempts\. Wait a minute and try again/);
		const right = await call('/login', { form: { email: user.email, password } });
		expect(right.status).toBe(429);
		// Once the wait is over the real user gets in, and the count starts again.
		await LoginThrottle.update({ blockedUntil: new Date(Date.now() - 1000) }, { where: { key: `account:${user.email}` } });
		expect((await call('/login', { form: { email: user.email, password } })).status).toBe(303);
		expect(await LoginThrottle.findByPk(`account:${user.email}`)).toBeNull();
	});

	it('lets exactly five of twenty simultaneous guesses reach a password check', async () => {
		const { user } = await makeUser('reviewer');
		const ip = '203.0.113.45';
		const results = await Promise.all(Array.from({ length: 20 }, (_, i) => attemptSignIn(user.email, `parallel guess ${i}`, ip)));
		expect(results.filter((r) => !r.ok && r.reason === 'invalid')).toHaveLength(5);
		expect(results.filter((r) => !r.ok && r.reason === 'throttled')).toHaveLength(15);
		await LoginThrottle.destroy({ where: { key: [`address:${ip}`, `account:${user.email}`] } });
	});

	it('throttles per address across many accounts, and an unknown address counts the same way', async () => {
		const ip = '203.0.113.44';
		let last;
		for (let i = 0; i < 31; i++) last = await attemptSignIn(`spray-${i}@example.org`, 'guess guess guess', ip);
		expect(last).toMatchObject({ ok: false, reason: 'throttled' });
		await LoginThrottle.destroy({ where: { key: `address:${ip}` } });
	});

	it('refuses a disabled account with the same words as a wrong password', async () => {
		const { user, password } = await makeUser('curator');
		await user.update({ disabled: true });
		const res = await call('/login', { form: { email: user.email, password } });
		expect(res.status).toBe(401);
		expect(await errorText(res)).toBe('That e-mail address and password do not match an active account.');
	});

	it('refuses malformed input with a clear message and changes nothing', async () => {
		const cases: [Record<string, string>, RegExp][] = [
			[{ email: 'not-an-address', password: 'whatever it is' }, /e-mail address such as/],
			[{ email: 'conservator@example.org', password: '' }, /Enter your password/],
			[{ email: `${'a'.repeat(250)}@example.org`, password: 'x' }, /at most 254 characters/],
			[{ password: 'x' }, /e-mail|expected string/i],
		];
		for (const [form, message] of cases) {
			const res = await call('/login', { form });
			expect(res.status).toBe(400);
			expect(await errorText(res)).toMatch(message);
			expect(sessionCookie(res)).toBeNull();
		}
		// Refused before any account was looked at: nothing counted against the account.
		expect(await LoginThrottle.findByPk('account:conservator@example.org')).toBeNull();
	});

	it('gives a new session id at every sign-in and ends the one the browser had (no fixation)', async () => {
		const { user, password } = await makeUser('conservator');
		const first = await cookieFor(user.id);
		const res = await call('/login', { form: { email: user.email, password }, cookie: first });
		const second = sessionCookie(res)!;
		expect(second).not.toBe(first);
		expect(await UserSession.findByPk(first.split('=')[1]!)).toBeNull();
	});

	it('signs out on the server: the old cookie no longer works', async () => {
		const { user } = await makeUser('conservator');
		const cookie = await cookieFor(user.id);
		expect((await call('/api/me', { cookie })).status).toBe(200);
		const out = await call('/logout', { method: 'POST', cookie });
		expect(out.status).toBe(303);
		expect(await UserSession.findByPk(cookie.split('=')[1]!)).toBeNull();
		expect((await call('/api/me', { cookie })).status).toBe(401);
	});
});

describe('changes to an account take effect on the next request', () => {
	it('applies a role change at once', async () => {
		const { user } = await makeUser('conservator');
		const admin = await signIn('admin@example.org');
		const cookie = await cookieFor(user.id);
		expect((await call('/admin/users', { cookie })).status).toBe(403);
		const patch = await call(`/api/users/${user.id}`, { method: 'PATCH', cookie: admin, json: { role: 'admin' } });
		expect(patch.status).toBe(200);
		expect((await call('/admin/users', { cookie })).status).toBe(200);
	});

	it('disabling a user ends their sessions', async () => {
		const { user } = await makeUser('reviewer');
		const admin = await signIn('admin@example.org');
		const cookie = await cookieFor(user.id);
		expect((await call('/api/me', { cookie })).status).toBe(200);
		await call(`/api/users/${user.id}`, { method: 'PATCH', cookie: admin, json: { disabled: true } });
		expect((await call('/api/me', { cookie })).status).toBe(401);
		expect(await UserSession.count({ where: { userId: user.id } })).toBe(0);
	});

	it('refuses a forged role, unknown fields and bad values, and changes nothing', async () => {
		const { user } = await makeUser('curator');
		const admin = await signIn('admin@example.org');
		for (const json of [{ role: 'superuser' }, { passwordHash: 'x' }, { name: '' }, { name: 'a\r\nBcc: x@example.org' }, {}, []]) {
			const res = await call(`/api/users/${user.id}`, { method: 'PATCH', cookie: admin, json });
			expect(res.status).toBe(400);
			expect((await res.json()).error).toBeTruthy();
		}
		await user.reload();
		expect(user.role).toBe('curator');
		expect(user.name).toBe('Test curator');
	});

	it('does not let an administrator lock themselves out', async () => {
		const { user } = await makeUser('admin');
		const cookie = await cookieFor(user.id);
		const res = await call(`/api/users/${user.id}`, { method: 'PATCH', cookie, json: { role: 'curator' } });
		expect(res.status).toBe(409);
	});
});

describe('session limits on the real session table', () => {
	it('ends a session after 30 idle minutes and deletes it', async () => {
		const { checkSession } = await import('../../src/lib/server/auth/lucia.ts');
		const { user } = await makeUser('curator');
		const id = (await cookieFor(user.id)).split('=')[1]!;
		const later = (min: number) => new Date(Date.now() + min * 60_000);
		expect((await checkSession(id, later(29))).user?.id).toBe(user.id);
		// That request moved the idle deadline to 29 + 30 minutes from now.
		expect((await checkSession(id, later(58))).user?.id).toBe(user.id);
		expect(await checkSession(id, later(58 + 31))).toEqual({ user: null, reason: 'expired' });
		expect(await UserSession.findByPk(id)).toBeNull();
	});

	it('ends even an active session 12 hours after sign-in', async () => {
		const { checkSession } = await import('../../src/lib/server/auth/lucia.ts');
		const { user } = await makeUser('curator');
		const id = (await cookieFor(user.id)).split('=')[1]!;
		await UserSession.update({ createdAt: new Date(Date.now() - 12 * 3_600_000 - 1000) }, { where: { id } });
		expect(await checkSession(id)).toEqual({ user: null, reason: 'expired' });
		expect((await call('/api/me', { cookie: `meniscus_session=${id}` })).status).toBe(401);
	});
});

describe('trusted browsers: throttling without a lockout (ASVS 5.0 6.3.1; OWASP, "Slow Down Online Guessing Attacks with Device Cookies")', () => {
	const guesser = '127.0.0.3';
	afterAll(async () => {
		await LoginThrottle.destroy({ where: { key: `address:${guesser}` } });
	});

	it('remembers the browser with an HttpOnly, SameSite=Strict device cookie, a new one at every sign-in', async () => {
		const { user, password } = await makeUser('reviewer');
		const first = await call('/login', { form: { email: user.email, password } });
		const set = first.headers.getSetCookie().find((c) => c.startsWith('meniscus_device='))!;
		expect(set).toMatch(/HttpOnly/i);
		expect(set).toMatch(/SameSite=Strict/i);
		expect(set).toMatch(/Path=\//);
		expect(set).toMatch(/Max-Age=15552000/); // 180 days
		const device = set.split(';')[0]!;
		// Only the token's hash is stored.
		const rows = await SignInDevice.findAll({ where: { userId: user.id } });
		expect(rows).toHaveLength(1);
		expect(rows[0]!.tokenHash).toMatch(/^[0-9a-f]{64}$/);
		expect(rows[0]!.tokenHash).not.toContain(device.split('=')[1]!);
		const second = await signInFrom(user.email, password, { cookie: device });
		expect(second.status).toBe(303);
		expect(deviceCookieOf(second)).not.toBe(device);
		expect(await SignInDevice.count({ where: { userId: user.id } })).toBe(1);
	});

	it('lets the real user in from their own browser while guesses from elsewhere throttle the account', async () => {
		const { user, password } = await makeUser('conservator');
		const own = deviceCookieOf(await signInFrom(user.email, password));
		for (let i = 0; i < 6; i++) await signInFrom(user.email, `wrong guess number ${i}`, { from: guesser });
		// A browser that never signed in to this account waits, with the right password too …
		expect((await signInFrom(user.email, password, { from: guesser })).status).toBe(429);
		// … and so does one bringing another account's device cookie or a made-up one.
		const other = await makeUser('curator');
		const othersDevice = deviceCookieOf(await signInFrom(other.user.email, other.password));
		expect((await signInFrom(user.email, password, { cookie: othersDevice })).status).toBe(429);
		expect((await signInFrom(user.email, password, { cookie: `meniscus_device=${'A'.repeat(43)}` })).status).toBe(429);
		// The owner's browser gets in, even from the guesser's address (a shared office address).
		const back = await signInFrom(user.email, password, { cookie: own, from: guesser });
		expect(back.status).toBe(303);
		expect(back.cookies.meniscus_session).toBeTruthy();
		// The account's count of guesses stands: untrusted browsers still wait.
		expect((await signInFrom(user.email, password)).status).toBe(429);
		await LoginThrottle.destroy({ where: { key: `account:${user.email}` } });
	});

	it('throttles a stolen device cookie on its own after ten wrong passwords', async () => {
		const { user, password } = await makeUser('reviewer');
		const device = deviceCookieOf(await signInFrom(user.email, password));
		for (let i = 0; i < 10; i++) expect((await signInFrom(user.email, `wrong guess number ${i}`, { cookie: device })).status).toBe(401);
		expect((await signInFrom(user.email, password, { cookie: device })).status).toBe(429);
		// The account itself was not charged: a fresh browser still signs in.
		expect(await LoginThrottle.findByPk(`account:${user.email}`)).toBeNull();
		expect((await signInFrom(user.email, password)).status).toBe(303);
	});

	it('forgets every remembered browser when the account is disabled or gets a new password', async () => {
		const { user, password } = await makeUser('curator');
		await signInFrom(user.email, password);
		expect(await SignInDevice.count({ where: { userId: user.id } })).toBe(1);
		const admin = await signedInUser('admin', 'devices');
		const res = await call(`/api/users/${user.id}`, { method: 'PATCH', json: { disabled: true }, cookie: admin.cookie });
		expect(res.status).toBe(200);
		expect(await SignInDevice.count({ where: { userId: user.id } })).toBe(0);

		// A new password through a mailed link: the old browsers are forgotten and the one that set
		// it is remembered (it proved it holds the mailbox), so it gets in during a flood of guesses.
		const other = await makeUser('reviewer');
		const old = deviceCookieOf(await signInFrom(other.user.email, other.password));
		const token = await issueToken(other.user.id, 'reset', 60_000);
		const fresh = 'a brand new passphrase for the jars';
		const reset = await call(`/reset/${token}`, { form: { password: fresh, confirm: fresh } });
		expect(reset.status).toBe(200);
		const resetDevice = reset.headers.getSetCookie().find((c) => c.startsWith('meniscus_device='))!.split(';')[0]!;
		expect(await SignInDevice.count({ where: { userId: other.user.id } })).toBe(1);
		for (let i = 0; i < 6; i++) await signInFrom(other.user.email, `wrong guess number ${i}`, { from: guesser });
		expect((await signInFrom(other.user.email, fresh, { cookie: old })).status).toBe(429);
		expect((await signInFrom(other.user.email, fresh, { cookie: resetDevice })).status).toBe(303);
		await LoginThrottle.destroy({ where: { key: `account:${other.user.email}` } });
	});
});
