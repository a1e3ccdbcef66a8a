/**
 * Invented pairs of mark layers whose changes are known by construction, for the compare tests and
 * bench/compare.ts: a before layer of n damage marks, one to a cell of a jittered grid (so no two
 * overlap and every expected match is unambiguous), and an after layer in which some marks are gone,
 * some are new (in cells left empty before), some grew or shrank about their own centre and the rest
 * moved by less than a pixel. Optionally the after layer is seen through a perspective transform, as
 * a photograph taken from a little to one side.
 */
import { DEFAULT_TERMS, PARTS } from '../../../src/lib/check/vocabulary.ts';
import { applyHomography } from '../../../src/lib/compare/registration.ts';
import type { ChangeClass } from '../../../src/lib/compare/changes.ts';
import { MARK_SCHEMA_VERSION, MarkLayerSchema, type Mark, type MarkLayer, type Point } from '../../../src/lib/marks/schema.ts';

/** Marsaglia's xorshift32 (J. Stat. Softw. 8(14), 2003): a seeded stream in [0, 1), the same every run. */
export function xorshift(seed: number): () => number {
	let x = seed >>> 0 || 1;
	return () => {
		x ^= x << 13;
		x ^= x >>> 17;
		x ^= x << 5;
		return (x >>> 0) / 4294967296;
	};
}

export const AUTHOR = '6f1c2a8e-3b4d-4e5f-8a9b-0c1d2e3f4a5b';
const TIME = '2026-03-14T10:00:00Z';
export const stamp = { authorId: AUTHOR, createdAt: TIME, updatedAt: TIME };

export const layerOf = (marks: unknown[]): MarkLayer => MarkLayerSchema.parse({ schemaVersion: MARK_SCHEMA_VERSION, marks, comments: [] });

export interface SyntheticPair {
	before: MarkLayer;
	after: MarkLayer;
	/** What each mark should be found to be: before ids for matched and resolved marks, after ids for new ones. */
	expected: Map<string, ChangeClass>;
}

type Geometry = { kind: 'outline' | 'path'; points: Point[] } | { kind: 'pin'; at: Point } | { kind: 'box'; x: number; y: number; w: number; h: number };

/** The fate of the k-th before mark: a fixed rotation, so every class is present at every n. */
const FATES: readonly ChangeClass[] = ['unchanged', 'grown', 'unchanged', 'shrunk', 'resolved', 'unchanged', 'grown', 'shrunk', 'unchanged', 'unchanged'];

export interface SyntheticOptions {
	seed?: number;
	width?: number;
	height?: number;
	/** The after photograph's view: before-photo px → after-photo px. */
	perspective?: number[][];
	/**
	 * How many marks the grid is laid out for (n and the new ones by default). A benchmark comparing
	 * several n gives them all its largest, so marks are the same size at every n and only their
	 * number changes; the first cells are used, row by row.
	 */
	capacity?: number;
}

export function syntheticPair(n: number, options: SyntheticOptions = {}): SyntheticPair {
	const r = xorshift(options.seed ?? 20_260_314);
	const width = options.width ?? 9504;
	const height = options.height ?? 6336;
	const between = (lo: number, hi: number) => lo + r() * (hi - lo);
	const newCount = Math.ceil(n / 10);
	const capacity = Math.max(options.capacity ?? 0, n + newCount);
	const cols = Math.ceil(Math.sqrt((capacity * width) / height));
	const rows = Math.ceil(capacity / cols);
	const cell = Math.min(width / cols, height / rows);
	const expected = new Map<string, ChangeClass>();

	/** A mark's geometry centred in cell k; its size leaves room to grow by 1.4 within the cell. */
	const invent = (k: number, kind: Geometry['kind']): { g: Geometry; c: Point } => {
		const c: Point = [(k % cols + 0.5) * cell + between(-0.05, 0.05) * cell, (Math.floor(k / cols) + 0.5) * cell + between(-0.05, 0.05) * cell];
		const radius = between(0.12, 0.25) * cell;
		if (kind === 'outline') {
			const m = Math.floor(between(8, 24));
			const points = Array.from({ length: m }, (_, i): Point => {
				const a = ((i + between(-0.3, 0.3)) / m) * 2 * Math.PI;
				const rr = radius * between(0.8, 1.2);
				return [c[0] + rr * Math.cos(a), c[1] + rr * Math.sin(a)];
			});
			return { g: { kind, points }, c };
		}
		if (kind === 'path') {
			// A gently bending crack starting at the centre: every step the same length, turning a little.
			let heading = between(0, 2 * Math.PI);
			const points: Point[] = [c];
			for (let i = 1; i < 8; i++) {
				heading += between(-0.3, 0.3);
				const [x, y] = points[i - 1]!;
				points.push([x + (radius / 7) * Math.cos(heading), y + (radius / 7) * Math.sin(heading)]);
			}
			return { g: { kind, points }, c };
		}
		if (kind === 'pin') return { g: { kind, at: c }, c };
		const w = radius * between(1, 1.6);
		const h = radius * between(1, 1.6);
		return { g: { kind, x: c[0] - w / 2, y: c[1] - h / 2, w, h }, c };
	};

	/** Grown (×1.4) or shrunk (×0.75) about the centre; lines lengthen or shorten along themselves. */
	const resize = (g: Geometry, c: Point, s: number): Geometry => {
		const about = (p: Point): Point => [c[0] + (p[0] - c[0]) * s, c[1] + (p[1] - c[1]) * s];
		if (g.kind === 'outline') return { kind: g.kind, points: g.points.map(about) };
		if (g.kind === 'box') return { kind: g.kind, x: c[0] - (c[0] - g.x) * s, y: c[1] - (c[1] - g.y) * s, w: g.w * s, h: g.h * s };
		if (g.kind === 'path') {
			if (s < 1) return { kind: g.kind, points: g.points.slice(0, Math.max(2, Math.round(g.points.length * s))) };
			const [p, q] = [g.points[g.points.length - 2]!, g.points[g.points.length - 1]!];
			const extra = Array.from({ length: Math.round(g.points.length * (s - 1)) + 1 }, (_, i): Point => [q[0] + (q[0] - p[0]) * (i + 1), q[1] + (q[1] - p[1]) * (i + 1)]);
			return { kind: g.kind, points: [...g.points, ...extra] };
		}
		return g;
	};

	/** Every point moved by f; a box becomes the outline of its moved corners (a perspective does not keep boxes). */
	const movePoints = (g: Geometry, f: (p: Point) => Point): Geometry => {
		if (g.kind === 'box') return { kind: 'outline', points: ([[g.x, g.y], [g.x + g.w, g.y], [g.x + g.w, g.y + g.h], [g.x, g.y + g.h]] as Point[]).map(f) };
		if (g.kind === 'pin') return { kind: g.kind, at: f(g.at) };
		return { kind: g.kind, points: g.points.map(f) };
	};
	// Less than a pixel, as the same damage marked again would be.
	const nudge = (g: Geometry): Geometry => (g.kind === 'box' ? { ...g, x: g.x + 0.4, y: g.y - 0.3 } : movePoints(g, (p) => [p[0] + 0.4, p[1] - 0.3]));
	/** The after photograph's view of a geometry, through the perspective when there is one. */
	const view = (g: Geometry): Geometry => (options.perspective ? movePoints(g, (p) => applyHomography(options.perspective!, p)) : g);

	const kinds = ['outline', 'outline', 'outline', 'path', 'path', 'box', 'pin'] as const;
	const before: Mark[] = [];
	const after: Mark[] = [];
	const damage = (k: number) => {
		const part = PARTS[k % PARTS.length]!;
		const terms = DEFAULT_TERMS[part];
		return { part, term: terms[Math.floor(k / PARTS.length) % terms.length]!, severity: 2, note: '' };
	};
	for (let k = 0; k < n; k++) {
		const kind = kinds[k % kinds.length]!;
		const { g, c } = invent(k, kind);
		const id = `b-${k}`;
		before.push({ ...stamp, id, ...damage(k), ...g } as Mark);
		// Pins have no size: a pin's fate is only to stay or go.
		let fate = FATES[k % FATES.length]!;
		if (kind === 'pin' && (fate === 'grown' || fate === 'shrunk')) fate = 'unchanged';
		expected.set(id, fate);
		if (fate === 'resolved') continue;
		const next = fate === 'grown' ? resize(g, c, 1.4) : fate === 'shrunk' ? resize(g, c, 0.75) : nudge(g);
		after.push({ ...stamp, id, ...damage(k), ...view(next) } as Mark);
	}
	for (let k = n; k < n + newCount; k++) {
		const { g } = invent(k, kinds[k % kinds.length]!);
		const id = `n-${k}`;
		expected.set(id, 'new');
		after.push({ ...stamp, id, ...damage(k), ...view(g) } as Mark);
	}
	// Control points near the corners and the middle of the photograph, for registration.
	const controls: Point[] = [[0.1, 0.1], [0.9, 0.12], [0.88, 0.9], [0.12, 0.85], [0.5, 0.45], [0.3, 0.6]].map(([u, v]) => [u! * width, v! * height]);
	controls.forEach((p, i) => {
		before.push({ ...stamp, id: `c-${i + 1}`, kind: 'control', n: i + 1, at: p });
		after.push({ ...stamp, id: `c-${i + 1}`, kind: 'control', n: i + 1, at: options.perspective ? applyHomography(options.perspective, p) : p });
	});
	return { before: layerOf(before), after: layerOf(after), expected };
}
