import { describe, expect, it } from 'vitest';
import { LayerMigrationError, MIGRATIONS, migrateLayer, migrateLayerWith, migrateRaw, type MigrationStep, type RawLayer } from '../../../src/lib/marks/migrate.ts';
import { MARK_SCHEMA_VERSION } from '../../../src/lib/marks/schema.ts';

const author = '6f1c2a8e-3b4d-4e5f-8a9b-0c1d2e3f4a5b';
const at = '2026-12-04T10:00:00Z';

const v1 = {
	schemaVersion: 1,
	marks: [{ id: 'm1', authorId: author, createdAt: at, updatedAt: at, kind: 'pin', part: 'label', term: 'faded', severity: 1, note: '', at: [10, 20] }],
	comments: [],
};

/**
 * A made-up "version 0" for exercising the runner: marks were called shapes, outlines were
 * "polygon" with points as {x, y} objects, and there was one timestamp.
 */
const fakeV0 = {
	schemaVersion: 0,
	shapes: [{ id: 'm1', authorId: author, time: at, kind: 'polygon', part: 'container', term: 'cracked', severity: 2, points: [{ x: 0, y: 0 }, { x: 10, y: 0 }, { x: 0, y: 10 }] }],
};
const v0to1: MigrationStep = {
	from: 0,
	to: 1,
	up(raw: RawLayer): RawLayer {
		const shapes = raw.shapes as { time: string; kind: string; points: { x: number; y: number }[]; [k: string]: unknown }[];
		return {
			marks: shapes.map(({ time, kind, points, ...rest }) => ({ ...rest, kind: kind === 'polygon' ? 'outline' : kind, createdAt: time, updatedAt: time, points: points.map((p) => [p.x, p.y]) })),
			comments: [],
		};
	},
};

describe('migrateLayer', () => {
	it('reads a current layer as it is, filling defaults', () => {
		const { note: _note, ...pin } = v1.marks[0]!;
		const layer = migrateLayer({ ...v1, marks: [pin], comments: undefined });
		expect(layer.marks[0]).toMatchObject({ kind: 'pin', note: '' });
		expect(layer.comments).toEqual([]);
	});

	it('has no steps yet, version 1 being the first', () => {
		expect(MARK_SCHEMA_VERSION).toBe(1);
		expect(MIGRATIONS).toEqual([]);
	});

	it('refuses a layer from a newer Meniscus, saying which versions', () => {
		expect(() => migrateLayer({ ...v1, schemaVersion: 3 })).toThrow('This layer was written by a newer Meniscus (version 3); this server reads up to version 1.');
	});

	it('refuses a layer without a version, or with a version that is not a whole number', () => {
		expect(() => migrateLayer({ marks: [], comments: [] })).toThrow(/no schemaVersion/);
		expect(() => migrateLayer({ ...v1, schemaVersion: '1' })).toThrow(/whole number, not "1"/);
		expect(() => migrateLayer({ ...v1, schemaVersion: 1.5 })).toThrow(LayerMigrationError);
		expect(() => migrateLayer({ ...v1, schemaVersion: -1 })).toThrow(LayerMigrationError);
	});

	it('refuses what is not an object', () => {
		for (const bad of [null, undefined, 42, 'layer', [v1]]) expect(() => migrateLayer(bad)).toThrow('A mark layer must be a JSON object.');
	});

	it('refuses an old version it has no step for', () => {
		expect(() => migrateLayer(fakeV0)).toThrow('This layer is version 0, and Meniscus has no way to bring a version 0 layer up to version 1.');
	});

	it('validates after migrating, naming where the layer is wrong', () => {
		const bad = { ...v1, marks: [{ ...v1.marks[0], severity: 5 }] };
		try {
			migrateLayer(bad);
			expect.unreachable();
		} catch (e) {
			expect(e).toBeInstanceOf(LayerMigrationError);
			expect((e as Error).message).toMatch(/^This mark layer is not valid\. marks\.0\.severity: Severity is 1 \(minor\), 2 \(moderate\) or 3 \(severe\)\./);
			expect((e as LayerMigrationError).issues.length).toBeGreaterThan(0);
		}
	});
});

describe('migrateLayerWith an injected registry', () => {
	it('brings a version 0 layer up to a valid version 1 layer', () => {
		const layer = migrateLayerWith(fakeV0, [v0to1]);
		expect(layer).toEqual({
			schemaVersion: 1,
			marks: [{ id: 'm1', authorId: author, createdAt: at, updatedAt: at, kind: 'outline', part: 'container', term: 'cracked', severity: 2, note: '', points: [[0, 0], [10, 0], [0, 10]] }],
			comments: [],
		});
	});

	it('leaves the stored object untouched', () => {
		const stored = structuredClone(fakeV0);
		// A careless step that edits its argument in place edits the runner's copy, not the caller's.
		const careless: MigrationStep = {
			from: 0,
			to: 1,
			up: (raw) => {
				delete raw.shapes;
				return Object.assign(raw, { marks: [], comments: [] });
			},
		};
		expect(migrateLayerWith(stored, [careless]).marks).toEqual([]);
		expect(stored).toEqual(fakeV0);
	});

	it('reports a step that fails, and one that returns nothing', () => {
		const failing: MigrationStep = {
			from: 0,
			to: 1,
			up: () => {
				throw new Error('shapes is missing');
			},
		};
		expect(() => migrateLayerWith(fakeV0, [failing])).toThrow('Bringing this layer from version 0 to 1 failed: shapes is missing');
		expect(() => migrateLayerWith(fakeV0, [{ from: 0, to: 1, up: () => null as unknown as RawLayer }])).toThrow(/did not return a layer/);
	});

	it('refuses a registry with gaps or duplicates', () => {
		expect(() => migrateLayerWith(fakeV0, [{ from: 0, to: 2, up: (r) => r }])).toThrow(/from one version to the next/);
		expect(() => migrateLayerWith(fakeV0, [v0to1, v0to1])).toThrow(/Two layer migrations start from version 0/);
	});
});

describe('migrateRaw', () => {
	it('chains steps in order, whatever order the registry lists them in', () => {
		const seen: number[] = [];
		const step = (from: number): MigrationStep => ({
			from,
			to: from + 1,
			up: (raw) => {
				seen.push(from);
				return { ...raw, trail: [...((raw.trail as number[]) ?? []), from] };
			},
		});
		const out = migrateRaw({ schemaVersion: 1 }, [step(3), step(1), step(2)], 4);
		expect(seen).toEqual([1, 2, 3]);
		expect(out).toEqual({ schemaVersion: 4, trail: [1, 2, 3] });
		expect(migrateRaw({ schemaVersion: 3 }, [step(3), step(1), step(2)], 4)).toEqual({ schemaVersion: 4, trail: [3] });
	});
});
