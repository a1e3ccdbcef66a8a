import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { ROUTE_RULES } from '../../src/lib/auth/permissions.ts';
import { routeFiles } from '../helpers/routes.ts';

/**
 * The declaration in permissions.ts and the files under src/pages must agree exactly: every route
 * file has a rule for each method it answers, and no rule is left over for a route that is gone.
 */
describe('the route permission table', () => {
	const files = routeFiles();

	it('finds the route files', () => {
		expect(files.length).toBeGreaterThan(5);
	});

	it.each(files.map((f) => [f.pattern, f]))('%s has a rule for every method it answers', (_p, f) => {
		const rule = ROUTE_RULES[f.pattern];
		expect(rule, `${f.file} has no entry in ROUTE_RULES`).toBeDefined();
		expect(Object.keys(rule!).sort()).toEqual([...f.methods].sort());
	});

	it('has no rule without a route file', () => {
		const patterns = new Set(files.map((f) => f.pattern));
		expect(Object.keys(ROUTE_RULES).filter((p) => !patterns.has(p))).toEqual([]);
	});

	it('reads endpoint methods from the source', () => {
		const src = fs.readFileSync(path.resolve('src/pages/api/users/index.ts'), 'utf8');
		expect(src).toMatch(/export const GET/);
		expect(files.find((f) => f.pattern === '/api/users')?.methods.sort()).toEqual(['GET', 'POST']);
	});
});

describe('the migration list', () => {
	it('names every file in db/migrations, in order', async () => {
		const { MIGRATIONS } = await import('../../db/migrations/index.ts');
		const files = fs
			.readdirSync(path.resolve('db/migrations'))
			.filter((f) => /^\d{14}-.+\.ts$/.test(f))
			.sort();
		expect(MIGRATIONS.map((m) => m.name)).toEqual(files);
	});
});
