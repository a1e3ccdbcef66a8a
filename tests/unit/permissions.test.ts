import { describe, expect, it } from 'vitest';
import { decide, safeNextPath, type RouteRule } from '../../src/lib/auth/permissions.ts';

const rules: Record<string, RouteRule> = {
	'/open': { GET: 'public' },
	'/any': { GET: 'signed-in', POST: 'signed-in' },
	'/admin': { GET: ['admin'] },
	'/two': { PATCH: ['reviewer', 'curator'] },
};
const as = (role: 'conservator' | 'reviewer' | 'curator' | 'admin') => ({ role });

describe('route permissions', () => {
	it('lets anybody use a public route', () => {
		expect(decide('/open', 'GET', null, rules)).toEqual({ kind: 'allow' });
	});
	it('sends a signed-out visitor to sign in, and lets any signed-in role through', () => {
		expect(decide('/any', 'GET', null, rules)).toEqual({ kind: 'sign-in' });
		expect(decide('/any', 'POST', as('curator'), rules)).toEqual({ kind: 'allow' });
	});
	it('refuses a role the rule does not list', () => {
		expect(decide('/admin', 'GET', as('reviewer'), rules)).toEqual({ kind: 'forbidden', reason: 'role' });
		expect(decide('/two', 'PATCH', as('conservator'), rules)).toEqual({ kind: 'forbidden', reason: 'role' });
		expect(decide('/two', 'PATCH', as('curator'), rules)).toEqual({ kind: 'allow' });
	});
	it('refuses a route without a rule for everybody, admin included (deny by default)', () => {
		expect(decide('/nowhere', 'GET', as('admin'), rules)).toEqual({ kind: 'forbidden', reason: 'no-rule' });
		expect(decide(undefined, 'GET', as('admin'), rules)).toEqual({ kind: 'forbidden', reason: 'no-rule' });
	});
	it('refuses a method the rule does not list, and treats HEAD as GET', () => {
		expect(decide('/admin', 'DELETE', as('admin'), rules)).toEqual({ kind: 'forbidden', reason: 'method' });
		expect(decide('/admin', 'HEAD', as('admin'), rules)).toEqual({ kind: 'allow' });
	});
	it('is not fooled by inherited object keys', () => {
		expect(decide('/open', 'constructor', null, rules).kind).toBe('forbidden');
		expect(decide('__proto__', 'GET', as('admin'), rules).kind).toBe('forbidden');
	});
});

describe('where to go after sign-in', () => {
	it('keeps a path on this site', () => {
		expect(safeNextPath('/admin/users?x=1')).toBe('/admin/users?x=1');
	});
	it('refuses anything that could leave the site', () => {
		for (const bad of ['//evil.example', 'https://evil.example/', '/\\evil.example', 'javascript:alert(1)', '', null, '/a\nb']) {
			expect(safeNextPath(bad)).toBe('/');
		}
	});
});
