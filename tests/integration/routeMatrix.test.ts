import { beforeAll, describe, expect, it } from 'vitest';
import { call, useTestDatabase } from '../helpers/server.ts';
import { cookieFor, makeUser } from '../helpers/users.ts';
import { ROUTE_RULES, type Access } from '../../src/lib/auth/permissions.ts';
import { ROLES, type Role } from '../../src/lib/auth/roles.ts';
import { routeFiles } from '../helpers/routes.ts';

/**
 * Every route file × every method it answers × every role and signed-out, against the built
 * server, compared with the declaration in permissions.ts (OWASP Authorization Testing
 * Automation: the matrix as data). Each cell gets a fresh session, since some cells sign out.
 */
type Who = Role | 'signed-out';
const WHO: Who[] = [...ROLES, 'signed-out'];
const users = new Map<Role, string>();

beforeAll(async () => {
	useTestDatabase();
	for (const r of ROLES) users.set(r, (await makeUser(r, { tag: `matrix-${r}` })).user.id);
});

const sample = (pattern: string) =>
	pattern.replace('[id]', '00000000-0000-4000-8000-000000000000').replace('[token]', 'x'.repeat(43)).replace('[...path]', 'a'.repeat(32));

function expected(access: Access, who: Who): 'allow' | 'sign-in' | 'forbidden' {
	if (access === 'public') return 'allow';
	if (who === 'signed-out') return 'sign-in';
	return access === 'signed-in' || access.includes(who) ? 'allow' : 'forbidden';
}

const cells = routeFiles().flatMap((f) =>
	f.methods.flatMap((method) => WHO.map((who) => ({ pattern: f.pattern, method, who }))),
);

describe('the authorisation matrix', () => {
	it.each(cells)('$method $pattern as $who', async ({ pattern, method, who }) => {
		const access = ROUTE_RULES[pattern]?.[method as 'GET'];
		expect(access, `no rule for ${method} ${pattern}`).toBeDefined();
		const cookie = who === 'signed-out' ? undefined : await cookieFor(users.get(who)!);
		const res = await call(sample(pattern), { method, cookie, json: method === 'GET' || method === 'HEAD' ? undefined : {} });
		const api = pattern.startsWith('/api/');
		const want = expected(access!, who);
		if (want === 'allow') {
			expect([401, 403, 405]).not.toContain(res.status);
			expect(res.headers.get('location') ?? '').not.toMatch(/^\/login\?next=/);
			// A page that throws while streaming still sends 200 first; the cut-off body shows it.
			if (!api && method === 'GET' && res.status === 200) expect(await res.text()).toMatch(/<\/html>\s*$/);
		} else if (want === 'sign-in') {
			if (api) expect(res.status).toBe(401);
			else {
				expect(res.status).toBe(302);
				expect(res.headers.get('location')).toMatch(/^\/login\?next=/);
			}
		} else {
			expect(res.status).toBe(403);
		}
	});

	it('refuses an address no route serves: sign in first, then 404', async () => {
		expect((await call('/api/not-a-route')).status).toBe(401);
		const cookie = await cookieFor(users.get('admin')!);
		expect((await call('/api/not-a-route', { cookie })).status).toBe(404);
		expect((await call('/no/such/page', { cookie })).status).toBe(404);
	});

	it('refuses a method a route does not declare, even for an administrator', async () => {
		const cookie = await cookieFor(users.get('admin')!);
		expect((await call('/api/users', { method: 'DELETE', cookie })).status).toBe(405);
		expect((await call('/api/me', { method: 'POST', cookie, json: {} })).status).toBe(405);
	});
});
