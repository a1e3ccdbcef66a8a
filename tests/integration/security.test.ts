import { beforeAll, describe, expect, it } from 'vitest';
import { call, useTestDatabase } from '../helpers/server.ts';
import { cookieFor, makeUser } from '../helpers/users.ts';
import { User } from '../../src/lib/server/models/index.ts';

/** Same-origin rule for changes (ASVS 3.5) and the response headers (ASVS 3.4, 14.3.2). */
let admin = '';
beforeAll(async () => {
	useTestDatabase();
	admin = await cookieFor((await makeUser('admin', { tag: 'sec' })).user.id);
});

describe('cross-site requests', () => {
	it('refuses a JSON change from another origin, and one with no Origin at all', async () => {
		const json = { email: 'evil@example.org', name: 'Evil', role: 'admin' };
		expect((await call('/api/users', { cookie: admin, json, origin: 'http://evil.example' })).status).toBe(403);
		expect((await call('/api/users', { cookie: admin, json, origin: null })).status).toBe(403);
		expect(await User.count({ where: { email: json.email } })).toBe(0);
	});

	it('refuses form posts from another origin in every form encoding, text/plain with parameters too', async () => {
		for (const type of ['application/x-www-form-urlencoded', 'multipart/form-data; boundary=x', 'text/plain', 'text/plain;x=1']) {
			const res = await call('/login', {
				method: 'POST',
				origin: 'http://evil.example',
				headers: { 'content-type': type },
			});
			expect(res.status, type).toBe(403);
		}
	});

	it('does not change anything on GET: signing out needs a POST', async () => {
		expect((await call('/logout', { cookie: admin })).status).toBe(405);
		expect((await call('/api/me', { cookie: admin })).status).toBe(200);
	});
});

describe('response headers', () => {
	it('sends nosniff, frame-ancestors none, no-store and a same-origin referrer on pages and API answers', async () => {
		for (const path of ['/', '/api/me', '/login']) {
			const res = await call(path, { cookie: admin });
			expect(res.headers.get('x-content-type-options')).toBe('nosniff');
			expect(res.headers.get('content-security-policy')).toMatch(/frame-ancestors 'none'/);
			expect(res.headers.get('content-security-policy')).toMatch(/object-src 'none'/);
			expect(res.headers.get('cache-control')).toBe('no-store');
			expect(res.headers.get('referrer-policy')).toBe('same-origin');
		}
	});

	it('never shows a password hash in the user list', async () => {
		const res = await call('/api/users', { cookie: admin });
		const text = await res.text();
		expect(text).not.toMatch(/argon2/);
		expect(text).not.toMatch(/passwordHash|password_hash/);
	});
});

describe('first-run set-up', () => {
	it('is closed once any account exists: GET goes to sign-in, POST creates nothing', async () => {
		expect((await call('/setup')).headers.get('location')).toBe('/login');
		const pw = 'a takeover attempt password';
		const res = await call('/setup', { form: { name: 'Intruder', email: 'intruder@example.org', password: pw, confirm: pw } });
		expect(res.status).toBe(409);
		expect(await User.count({ where: { email: 'intruder@example.org' } })).toBe(0);
	});
});
