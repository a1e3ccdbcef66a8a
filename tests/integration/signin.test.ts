import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { call, sessionCookie, signIn, useTestDatabase } from '../helpers/server.ts';
import { cookieFor, makeUser } from '../helpers/users.ts';
import { db } from '../../src/lib/server/db.ts';
import { LoginThrottle, UserSession } from '../../src/lib/server/models/index.ts';
import { attemptSignIn } from '../../src/lib/server/auth/signin.ts';

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
		const set = res.headers.getSetCookie().join('\n');
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
