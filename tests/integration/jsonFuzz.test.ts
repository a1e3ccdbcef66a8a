import fc from 'fast-check';
import { beforeAll, describe, expect, it } from 'vitest';
import { call, useTestDatabase } from '../helpers/server.ts';
import { specimenRecord } from '../helpers/specimens.ts';
import { auditCount, buildWorld, worldLayer, worldRows, type World } from '../helpers/world.ts';
import { writeRoutes, type WriteRoute } from '../helpers/writeRoutes.ts';
import { validWrites } from '../helpers/validWrites.ts';
import type { MarkLayer } from '../../src/lib/marks/schema.ts';

/**
 * TESTPLAN B5 (ASVS 5.0 2.2.1/2.2.2 positive validation, 15.3.6 no prototype pollution; fast-check
 * fuzzing): hostile JSON against every API route that takes a JSON body, each as the role its rule
 * admits, on records of our own. Every answer is a 4xx with a JSON error, never a 500, and nothing
 * the body names is stored: the rows and the audit trail read the same afterwards.
 */
let w: World;
let routes: WriteRoute[];

beforeAll(async () => {
	useTestDatabase();
	w = await buildWorld('fuzz');
	routes = writeRoutes(w);
});

const PROTO_KEYS = ['__proto__', 'constructor', 'prototype'];
/** Top-level names the routes really read, so fuzzed values reach past the first schema check. */
const KEYS = ['version', 'check', 'record', 'layer', 'comparison', 'decision', 'comment', 'fileNames', 'csv', 'mapping', 'corrects', 'code', 'name', 'email', 'role', ...PROTO_KEYS];
/** Numbers that pass a plain `z.number()` but not a database integer column or a sane range. */
const edgeNumber = fc.constantFrom(2 ** 31, 2 ** 53 + 2, 1e308, -1, -0, 0.5, 5e-324);
const value = fc.oneof(fc.jsonValue({ maxDepth: 3 }), edgeNumber, fc.string({ maxLength: 40 }));
const nest = (n: number, open: string, close: string, inner = '1') => open.repeat(n) + inner + close.repeat(n);

/** Bodies as sent on the wire: some are not JSON at all, some are deep or huge, some smuggle prototype keys. */
const hostileBody = fc.oneof(
	fc.json({ maxDepth: 4 }),
	fc.anything({ maxDepth: 3 }).map((v) => JSON.stringify(v) ?? 'null'),
	fc.dictionary(fc.constantFrom(...KEYS), value, { minKeys: 1, maxKeys: 4 }).map((o) => JSON.stringify(o)),
	fc.constantFrom(...PROTO_KEYS).map((k) => `{"${k}":{"polluted":true,"prototype":{"polluted":true}},"version":0}`),
	fc.integer({ min: 1_000, max: 40_000 }).map((n) => nest(n, '[', ']')),
	fc.integer({ min: 1_000, max: 30_000 }).map((n) => nest(n, '{"layer":', '}')),
	fc.integer({ min: 200_000, max: 400_000 }).map((n) => JSON.stringify({ version: 0, note: 'x'.repeat(n) })),
	fc.string({ maxLength: 60 }),
);
// `{}` is itself a valid request to open a check (nothing to correct), so it is no hostile input.
const notEmptyObject = (body: string) => body.replace(/\s/g, '') !== '{}';

const send = (r: WriteRoute, body: string) => call(r.path, { method: r.method, cookie: r.who.cookie, raw: body, headers: { 'content-type': 'application/json' } });

async function expectJsonRefusal(res: Response, what: string): Promise<void> {
	const text = await res.text();
	expect(res.status, `${what}: ${text.slice(0, 200)}`).toBeGreaterThanOrEqual(400);
	expect(res.status, `${what}: ${text.slice(0, 200)}`).toBeLessThan(500);
	expect(res.headers.get('content-type'), what).toMatch(/^application\/json/);
	expect(typeof JSON.parse(text).error, what).toBe('string');
}

describe('hostile JSON on every write route', () => {
	it('finds the write routes from the route table, the JSON ones and the one that takes no body (tus aside: tusAbuse.test.ts)', () => {
		expect(routes.filter((r) => r.json).length).toBeGreaterThan(20);
		// A new route without a JSON body shows up here and must get its own hostile-input test.
		expect(routes.filter((r) => !r.json && r.pattern !== '/api/uploads/[...path]').map((r) => `${r.method} ${r.pattern}`)).toEqual(['POST /api/users/[id]/invitation']);
	});

	it('answers every fuzzed body with a 4xx and a JSON error, and stores nothing', async () => {
		const rows = await worldRows(w);
		const audits = await auditCount(w);
		for (const r of routes.filter((x) => x.json)) {
			await fc.assert(
				fc.asyncProperty(hostileBody.filter(notEmptyObject), async (body) => {
					await expectJsonRefusal(await send(r, body), `${r.method} ${r.pattern} as ${r.role} with ${body.slice(0, 80)}`);
				}),
				{ numRuns: 25 },
			);
		}
		expect(await worldRows(w)).toEqual(rows);
		expect(await auditCount(w)).toBe(audits);
	}, 60_000);
});

describe('prototype keys', () => {
	const layerWith = (extra: string, version: number, layer: MarkLayer) => {
		const text = JSON.stringify({ version, layer });
		// JSON.parse makes "__proto__" an own key; inserting it as text is the only way to send one.
		return text.replace('"schemaVersion":1', `"schemaVersion":1,${extra}`).replace('"kind":"path"', `"kind":"path",${extra}`);
	};

	it('are refused inside a mark layer and a specimen record, and never show up in what is read back', async () => {
		const before = await (await call(`/api/photos/${w.photoId}/marks`, { cookie: w.a.cookie })).json();
		for (const extra of ['"__proto__":{"polluted":true}', '"constructor":{"prototype":{"polluted":true}}']) {
			const res = await call(`/api/photos/${w.photoId}/marks`, { method: 'PUT', cookie: w.a.cookie, raw: layerWith(extra, before.version, before.layer), headers: { 'content-type': 'application/json' } });
			await expectJsonRefusal(res, extra);
			const { specimen } = await (await call(`/api/specimens/${w.specimenId}`, { cookie: w.a.cookie })).json();
			// The record as it was made, valid but for the smuggled key.
			const specimenBody = JSON.stringify({ version: specimen.version, record: specimenRecord('x', { objectNumber: w.objectNumber }) }).replace('{"objectNumber"', `{${extra},"objectNumber"`);
			await expectJsonRefusal(await call(`/api/specimens/${w.specimenId}`, { method: 'PUT', cookie: w.a.cookie, raw: specimenBody, headers: { 'content-type': 'application/json' } }), `specimen ${extra}`);
		}
		const after = await call(`/api/photos/${w.photoId}/marks`, { cookie: w.a.cookie });
		const text = await after.text();
		expect(text).not.toMatch(/polluted/);
		expect(JSON.parse(text)).toMatchObject({ version: before.version, layer: before.layer });
	});
});

describe('a valid mark layer after all that', () => {
	it('still saves and reads back exactly, with no property it was not sent', async () => {
		const { version } = await (await call(`/api/photos/${w.photoId}/marks`, { cookie: w.a.cookie })).json();
		const layer = worldLayer(w.a.id);
		layer.marks.push({ id: 'pin', kind: 'pin', part: 'label', term: 'faded', severity: 1, note: 'Ink faded: {{7*7}} <b>', at: [300, 200], authorId: w.a.id, createdAt: '2026-12-02T09:30:00.000Z', updatedAt: '2026-12-02T09:30:00.000Z' });
		const res = await call(`/api/photos/${w.photoId}/marks`, { method: 'PUT', cookie: w.a.cookie, json: { version, layer } });
		expect(res.status, await res.clone().text()).toBe(200);
		const back = await (await call(`/api/photos/${w.photoId}/marks`, { cookie: w.b.cookie })).json();
		expect(back.version).toBe(version + 1);
		expect(back.layer).toEqual(layer);
	});
});

/** Every path to a leaf (a value that is no object or array) of a JSON value. */
function leafPaths(v: unknown, at: (string | number)[] = []): (string | number)[][] {
	if (Array.isArray(v)) return v.flatMap((x, i) => leafPaths(x, [...at, i]));
	if (v && typeof v === 'object') return Object.entries(v).flatMap(([k, x]) => leafPaths(x, [...at, k]));
	return [at];
}

function withLeaf(body: unknown, at: (string | number)[], value: unknown): unknown {
	const copy = structuredClone(body) as Record<string | number, unknown>;
	let node = copy;
	for (const k of at.slice(0, -1)) node = node[k] as Record<string | number, unknown>;
	node[at.at(-1)!] = value;
	return copy;
}

describe('valid bodies with one value made hostile', () => {
	// Deep, huge, of the wrong kind, or numbers a database column cannot hold: each reaches the
	// schema's inner checks (and past them, the database) instead of failing at the top.
	// Deep and huge values are made inside the property from their size, so that fast-check can
	// print a failing case without walking five thousand levels.
	type Leaf = { deep: number } | { long: number } | { value: unknown };
	const leafChoice: fc.Arbitrary<Leaf> = fc.oneof(
		fc.integer({ min: 50, max: 5_000 }).map((deep) => ({ deep })),
		fc.integer({ min: 10_001, max: 60_000 }).map((long) => ({ long })),
		fc
			.oneof(
				edgeNumber,
				fc.constantFrom(2 ** 63, -(2 ** 31) - 1, 1e-7),
				fc.constant(JSON.parse('{"__proto__":{"polluted":true}}')),
				fc.constantFrom('', ' ', '\u0000', '\ud800', 'NaN', '1e308', '2026-02-30', '00000000-0000-0000-0000-000000000000'),
				fc.jsonValue({ maxDepth: 2 }),
			)
			.map((value) => ({ value })),
	);
	const HOLE = '\u0001hole\u0001';
	/** The body as sent, with the leaf at `at` replaced (a deep value spliced in as text: JSON.stringify recurses). */
	const bodyText = (body: unknown, at: (string | number)[], l: Leaf): string => {
		if (!('deep' in l)) return JSON.stringify(withLeaf(body, at, 'long' in l ? 'x'.repeat(l.long) : l.value));
		return JSON.stringify(withLeaf(body, at, HOLE)).replace(JSON.stringify(HOLE), nest(l.deep, '[', ']', '0'));
	};

	it('refuses a NUL or a lone surrogate in a text field with a 400 (PostgreSQL cannot store them: they were 500s)', async () => {
		const rows = await worldRows(w);
		// A free-text field of each, so that nothing but the character is wrong with the body.
		const freeText: Record<string, (string | number)[]> = {
			'saving a check': ['check', 'notes'],
			'editing a specimen': ['record', 'title'],
			'saving a comparison': ['comparison', 'note'],
			'saving a mark layer': ['layer', 'marks', 0, 'note'],
		};
		for (const c of validWrites(w).filter((x) => x.name in freeText)) {
			const body = await c.body();
			const at = freeText[c.name]!;
			for (const bad of ['before\u0000after', 'before\ud800after', '\udc00']) {
				await expectJsonRefusal(await call(c.path, { method: c.method, cookie: c.who.cookie, json: withLeaf(body, at, bad) }), `${c.name}: ${at.join('.')} = ${JSON.stringify(bad)}`);
			}
		}
		expect(await worldRows(w)).toEqual(rows);
	});

	it('refuses a size or a limit the database would round to 0 with a 400 (it was a 500)', async () => {
		const rows = await worldRows(w);
		const edit = validWrites(w).find((c) => c.name === 'editing a specimen')!;
		const body = await edit.body();
		for (const at of [['record', 'innerWidthMm'], ['record', 'innerHeightMm']]) {
			await expectJsonRefusal(await call(edit.path, { method: 'PUT', cookie: edit.who.cookie, json: withLeaf(body, at, 1e-7) }), at.join('.'));
		}
		await expectJsonRefusal(await call(`/api/locations/${w.locationId}`, { method: 'PATCH', cookie: w.admin.cookie, json: { flammableLimitL: 0.01 } }), 'flammableLimitL');
		expect(await worldRows(w)).toEqual(rows);
	});

	it('never answers with a 500, and refusals carry a JSON error', async () => {
		// Submitting or approving would close the check to the rest; those bodies are one version number.
		for (const c of validWrites(w).filter((x) => !['submitting a check', 'reviewing a check'].includes(x.name))) {
			const body = await c.body();
			const paths = leafPaths(body);
			if (paths.length === 0) continue;
			await fc.assert(
				fc.asyncProperty(fc.constantFrom(...paths), leafChoice, async (at, leaf) => {
					const res = await call(c.path, { method: c.method, cookie: c.who.cookie, raw: bodyText(body, at, leaf), headers: { 'content-type': 'application/json' } });
					const what = `${c.name}: ${at.join('.')} = ${JSON.stringify(leaf).slice(0, 80)}`;
					if (res.status >= 400) await expectJsonRefusal(res, what);
					else expect(res.status, what).toBeLessThan(300);
				}),
				{ numRuns: 30 },
			);
		}
	}, 60_000);
});
