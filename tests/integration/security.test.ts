import { beforeAll, describe, expect, it } from 'vitest';
import { call, useTestDatabase } from '../helpers/server.ts';
import { cookieFor, makeUser } from '../helpers/users.ts';
import { tusMetadata } from '../helpers/photos.ts';
import { auditCount, buildWorld, worldRows, type World } from '../helpers/world.ts';
import { readRoutes, writeRoutes } from '../helpers/writeRoutes.ts';
import { User } from '../../src/lib/server/models/index.ts';

/**
 * Same-origin rule for changes (TESTPLAN A8; ASVS 5.0 3.5.1–3.5.3, 3.4.2) and the response headers
 * (TESTPLAN A9; ASVS 5.0 3.4.3 CSP, 3.4.4 nosniff, 3.4.6 frame-ancestors, 14.3.2 no-store), on every
 * route the route table lists and every kind of answer the app gives.
 */
let admin = '';
let w: World;
beforeAll(async () => {
	useTestDatabase();
	admin = await cookieFor((await makeUser('admin', { tag: 'sec' })).user.id);
	w = await buildWorld('sec');
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

	it('refuses a cross-site change on every write route, in each encoding a form sends without a preflight and in JSON, and changes nothing', async () => {
		const rows = await worldRows(w);
		const audits = await auditCount(w);
		const routes = writeRoutes(w);
		expect(routes.map((r) => r.pattern)).toContain('/api/uploads/[...path]');
		for (const r of routes) {
			// Astro's own checkOrigin refuses the form encodings too; JSON is this app's rule alone.
			for (const type of ['text/plain', 'text/plain;x=1', 'application/x-www-form-urlencoded', 'multipart/form-data; boundary=x', 'application/json']) {
				// "null" is what a sandboxed frame or a redirected form sends as its Origin.
				for (const origin of ['http://evil.example', 'null']) {
					const res = await call(r.path, { method: r.method, cookie: r.who.cookie, origin, raw: '{"version":0}', headers: { 'content-type': type } });
					expect(res.status, `${r.method} ${r.pattern} ${type} from ${origin}`).toBe(403);
				}
			}
			// No Origin at all, but the browser says the request came from another site.
			const res = await call(r.path, { method: r.method, cookie: r.who.cookie, origin: null, raw: '{}', headers: { 'content-type': 'application/json', 'sec-fetch-site': 'cross-site' } });
			expect(res.status, `${r.method} ${r.pattern} without Origin`).toBe(403);
		}
		expect(await worldRows(w)).toEqual(rows);
		expect(await auditCount(w)).toBe(audits);
	});

	it('lets no other site into the tus endpoint: a preflight is not granted, a creation is refused', async () => {
		const preflight = await call('/api/uploads/', { method: 'OPTIONS', origin: 'http://evil.example', headers: { 'access-control-request-method': 'POST', 'access-control-request-headers': 'tus-resumable,upload-length' } });
		expect(preflight.headers.get('access-control-allow-origin') ?? 'none').not.toMatch(/^(\*|http:\/\/evil\.example)$/);
		const create = await call('/api/uploads/', { method: 'POST', cookie: w.a.cookie, origin: 'http://evil.example', headers: { 'tus-resumable': '1.0.0', 'upload-length': '10', 'upload-metadata': tusMetadata({ filename: 'x.jpg', specimenId: w.specimenId, view: 'front', stage: 'as-found' }) } });
		expect(create.status).toBe(403);
		expect(create.headers.get('access-control-allow-origin')).toBeNull();
	});

	it('changes nothing on GET, on any page or API read, whoever asks', async () => {
		const rows = await worldRows(w);
		const audits = await auditCount(w);
		for (const who of [w.a, w.reviewer, w.curator, w.admin]) {
			for (const r of readRoutes(w)) expect((await call(r.path, { cookie: who.cookie })).status, r.path).toBeLessThan(500);
		}
		expect(await worldRows(w)).toEqual(rows);
		expect(await auditCount(w)).toBe(audits);
	}, 60_000);

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

	const IMAGE_KINDS = ['tile info', 'tile', 'display', 'original'];

	it('sends them on every kind of answer: page, JSON, tile, display copy, original, PDF, CSV, manifest, tus, errors and redirects', async () => {
		const info = await (await call(`/api/photos/${w.photoId}/tiles/info.json`, { cookie: w.a.cookie })).json();
		const [tw, th] = [Math.min(512, info.width), Math.min(512, info.height)];
		const tus = { 'tus-resumable': '1.0.0' };
		const kinds: [string, Promise<Response>][] = [
			['page', call(`/checks/${w.checkId}`, { cookie: w.a.cookie })],
			['JSON', call(`/api/checks/${w.checkId}`, { cookie: w.a.cookie })],
			['tile info', call(`/api/photos/${w.photoId}/tiles/info.json`, { cookie: w.a.cookie })],
			['tile', call(`/api/photos/${w.photoId}/tiles/0,0,${tw},${th}/${tw},${th}/0/default.jpg`, { cookie: w.a.cookie })],
			['display', call(`/api/photos/${w.photoId}/display`, { cookie: w.a.cookie })],
			['original', call(`/api/photos/${w.photoId}/original`, { cookie: w.a.cookie })],
			['PDF', call(`/api/checks/${w.checkId}/report.pdf`, { cookie: w.a.cookie })],
			['CSV', call(`/api/checks/export.csv?specimen=${w.specimenId}`, { cookie: w.a.cookie })],
			['manifest', call(`/api/specimens/${w.specimenId}/manifest`, { cookie: w.a.cookie })],
			['tus HEAD', call(w.uploadPath, { method: 'HEAD', cookie: w.a.cookie, headers: tus })],
			['tus 412', call('/api/uploads/', { method: 'POST', cookie: w.a.cookie, headers: {} })],
			['JSON 404', call('/api/checks/00000000-0000-4000-8000-000000000000', { cookie: w.a.cookie })],
			['page 403', call('/admin/users', { cookie: w.curator.cookie })],
			['cross-site 403', call('/api/specimens', { cookie: w.a.cookie, origin: 'http://evil.example', json: {} })],
			['sign-in redirect', call(`/checks/${w.checkId}`)],
		];
		for (const [kind, pending] of kinds) {
			const res = await pending;
			expect(res.status, kind).toBeLessThan(500);
			expect(res.headers.get('x-content-type-options'), kind).toBe('nosniff');
			const csp = res.headers.get('content-security-policy') ?? '';
			for (const d of ["frame-ancestors 'none'", "object-src 'none'", "base-uri 'none'"]) expect(csp, `${kind}: ${d}`).toContain(d);
			// Records are never stored by a cache; an image and its IIIF description (no record in them)
			// may be kept by this browser only.
			const cache = res.headers.get('cache-control');
			if (IMAGE_KINDS.includes(kind)) expect(cache, kind).toMatch(/^private\b/);
			else expect(cache, kind).toMatch(/\bno-store\b/);
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
