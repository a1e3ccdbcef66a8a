import fs from 'node:fs';
import path from 'node:path';
import { ROUTE_RULES, type Method } from '../../src/lib/auth/permissions.ts';
import type { Role } from '../../src/lib/auth/roles.ts';
import { routeFiles } from './routes.ts';
import type { Person, World } from './world.ts';

/**
 * Every API route that changes something, read from the route files and ROUTE_RULES (so a new
 * route is picked up without touching the tests), with its parameters filled from a World and the
 * first role its rule admits. The tus endpoint counts as a write route but not a JSON one: it takes bytes.
 */
export interface WriteRoute {
	pattern: string;
	method: Method;
	path: string;
	/** Whether the route reads a JSON body (readJson, directly or through a route helper). */
	json: boolean;
	who: Person;
	role: Role;
}

const NOT_JSON = new Set(['/api/uploads/[...path]']);
const WRITES: Method[] = ['POST', 'PUT', 'PATCH', 'DELETE'];
/** Route helpers that read the body with readJson on the route's behalf. */
const JSON_HELPERS = /\b(readJson|calculator)\(/;

/** The World's record behind each resource an API path names by id. */
function idFor(resource: string, w: World): string {
	const ids: Record<string, string> = {
		specimens: w.specimenId,
		checks: w.checkId,
		photos: w.photoId,
		comparisons: w.comparisonId,
		users: w.targetUserId,
		locations: w.locationId,
		treatments: w.treatmentId,
		'treatment-materials': w.materialId,
	};
	const id = ids[resource];
	if (!id) throw new Error(`no World record for /${resource}/[id]: add one to tests/helpers/world.ts`);
	return id;
}

/** A route pattern with each parameter filled from the World (`[...path]`: a tile's info, or A's upload). */
export function fillPath(pattern: string, w: World): string {
	const segs = pattern.split('/');
	return segs
		.map((seg, i) => {
			if (seg === '[id]') return idFor(segs[i - 1] ?? '', w);
			if (seg === '[photo]') return w.photoId;
			if (seg === '[token]') return 'x'.repeat(43);
			if (seg === '[...path]') return segs[i - 1] === 'tiles' ? 'info.json' : w.uploadPath.split('/').pop()!;
			return seg;
		})
		.join('/');
}

export function personFor(role: Role, w: World): Person {
	return { conservator: w.a, reviewer: w.reviewer, curator: w.curator, admin: w.admin }[role];
}

/** Every route and method that only reads (GET), filled from the World. */
export function readRoutes(w: World): { pattern: string; path: string }[] {
	return routeFiles()
		.filter((f) => f.methods.includes('GET'))
		.map((f) => ({ pattern: f.pattern, path: fillPath(f.pattern, w) }));
}

export function writeRoutes(w: World): WriteRoute[] {
	return routeFiles()
		.filter((f) => f.pattern.startsWith('/api/'))
		.flatMap((f) => {
			const src = fs.readFileSync(path.resolve('src/pages', f.file), 'utf8');
			return f.methods
				.filter((m): m is Method => (WRITES as string[]).includes(m))
				.map((method) => {
					const access = ROUTE_RULES[f.pattern]![method]!;
					const role: Role = access === 'public' || access === 'signed-in' ? 'conservator' : access[0]!;
					return { pattern: f.pattern, method, path: fillPath(f.pattern, w), json: !NOT_JSON.has(f.pattern) && JSON_HELPERS.test(src), who: personFor(role, w), role };
				});
		});
}
