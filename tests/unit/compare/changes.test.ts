import { describe, expect, it } from 'vitest';
import { compareMarkLayers, MATCH_MIN_IOU, NOISE_ABS_PX2, NOISE_RELATIVE, type Comparison, type MarkChange } from '../../../src/lib/compare/changes.ts';
import { pairsFromControlMarks } from '../../../src/lib/compare/pairs.ts';
import { applyHomography, fitHomography, type Matrix3 } from '../../../src/lib/compare/registration.ts';
import type { MarkLayer } from '../../../src/lib/marks/schema.ts';
import { layerOf, stamp, syntheticPair } from './synthetic.ts';

type P = [number, number];
const sq = (x: number, y: number, w: number, h = w): P[] => [[x, y], [x + w, y], [x + w, y + h], [x, y + h]];
const dmg = (id: string, part: string, term: string, geometry: Record<string, unknown>) => ({ ...stamp, id, part, term, severity: 2, note: '', ...geometry });
const outline = (id: string, part: string, term: string, points: P[]) => dmg(id, part, term, { kind: 'outline', points });

/**
 * Hand-made layers with one mark of each fate, with sizes worked out by hand:
 * A unchanged (moved 1 px); B grown 100² → 150² = 10,000 → 22,500 px² (+12,500, +125 %);
 * C (a box) shrunk 200 × 100 → 150 × 100 = 20,000 → 15,000 px² (−5,000, −25 %);
 * D (a line) grown 300 → 500 px; E (a pin) resolved; F new (80² = 6,400 px²);
 * G unchanged within the relative noise: 100² → 102.4² = 10,485.76 px² (+4.9 % < 10 %);
 * K unchanged within the absolute noise: 20 × 20 → 23 × 20 = 400 → 460 px² (+15 % but +60 px² < 100 px²);
 * H resolved and H2 new: the same place, another term; I (a pin) unchanged, moved (3, 1) px.
 */
const before = layerOf([
	outline('A', 'container', 'cracked', sq(1000, 1000, 100)),
	outline('B', 'specimen', 'tissue loss', sq(2000, 1000, 100)),
	dmg('C', 'label', 'torn', { kind: 'box', x: 3000, y: 1000, w: 200, h: 100 }),
	dmg('D', 'container', 'chipped', { kind: 'path', points: [[1000, 2000], [1300, 2000]] }),
	dmg('E', 'fluid', 'sediment', { kind: 'pin', at: [500, 3000] }),
	outline('G', 'lid', 'corroded', sq(2000, 2000, 100)),
	outline('K', 'mount', 'slack thread', sq(3000, 2000, 20)),
	outline('H', 'label', 'faded', sq(4000, 1000, 100)),
	dmg('I', 'lid', 'loose', { kind: 'pin', at: [600, 3000] }),
	{ ...stamp, id: 'lvl', kind: 'level', level: 'fluid-line', from: [0, 50], to: [500, 50] },
]);
const afterMarks = [
	outline('A', 'container', 'cracked', sq(1001, 1000, 100)),
	outline('B', 'specimen', 'tissue loss', sq(1975, 975, 150)),
	dmg('C', 'label', 'torn', { kind: 'box', x: 3025, y: 1000, w: 150, h: 100 }),
	dmg('D', 'container', 'chipped', { kind: 'path', points: [[1000, 2000], [1300, 2000], [1500, 2000]] }),
	outline('F', 'seal', 'perished', sq(4000, 3000, 80)),
	outline('G', 'lid', 'corroded', sq(1998.8, 1998.8, 102.4)),
	outline('K', 'mount', 'slack thread', sq(3000, 2000, 23, 20)),
	outline('H2', 'label', 'torn', sq(4000, 1000, 100)),
	dmg('I', 'lid', 'loose', { kind: 'pin', at: [603, 3001] }),
];
const after = layerOf(afterMarks);
const expectedClass: Record<string, MarkChange['change']> = { A: 'unchanged', B: 'grown', C: 'shrunk', D: 'grown', E: 'resolved', F: 'new', G: 'unchanged', K: 'unchanged', H: 'resolved', H2: 'new', I: 'unchanged' };

const idOf = (c: MarkChange) => (c.before ?? c.after)!.id;
const byId = (r: Comparison) => new Map(r.changes.map((c) => [idOf(c), c]));

/** Every change's class against what the layers were built to show. */
function expectClasses(r: Comparison, expected: Record<string, string> | Map<string, string>) {
	const want = expected instanceof Map ? Object.fromEntries(expected) : expected;
	expect(Object.fromEntries(r.changes.map((c) => [idOf(c), c.change]))).toEqual(want);
}

/** The hand-made after layer as a photograph taken from elsewhere sees it: every point through h, boxes becoming outlines. */
function seenThrough(h: Matrix3, marks: typeof afterMarks, controls: P[]): MarkLayer {
	const map = (p: P) => applyHomography(h, p);
	const moved = marks.map((m) => {
		if ('points' in m) return { ...m, points: (m.points as P[]).map(map) };
		if ('at' in m) return { ...m, at: map(m.at as P) };
		const { x, y, w, h: height, ...rest } = m as unknown as { x: number; y: number; w: number; h: number };
		return { ...rest, kind: 'outline', points: sq(x, y, w, height).map(map) };
	});
	return layerOf([...moved, ...controls.map((p, i) => ({ ...stamp, id: `c${i + 1}`, kind: 'control', n: i + 1, at: map(p) }))]);
}

describe('compareMarkLayers on hand-made layers', () => {
	const r = compareMarkLayers(before, after);

	it('classes each mark as built: new, resolved, grown, shrunk or unchanged', () => {
		expectClasses(r, expectedClass);
		expect(r.summary.counts).toEqual({ new: 2, resolved: 2, grown: 2, shrunk: 1, unchanged: 4 });
		expect(r.basis).toEqual({ area: 'px²', length: 'px' });
	});

	it('gives the hand-computed sizes, changes and overlaps', () => {
		const c = byId(r);
		expect(c.get('B')!.areaPx2).toEqual({ before: 10_000, after: 22_500, change: 12_500 });
		expect(c.get('B')!.relative).toBeCloseTo(1.25, 12);
		// B's earlier square lies inside the later one: IoU = 10,000 / 22,500.
		expect(c.get('B')!.iou).toBeCloseTo(10_000 / 22_500, 3);
		expect(c.get('C')!.areaPx2).toEqual({ before: 20_000, after: 15_000, change: -5_000 });
		expect(c.get('C')!.iou).toBeCloseTo(0.75, 3);
		expect(c.get('D')!.lengthPx).toEqual({ before: 300, after: 500, change: 200 });
		expect(c.get('D')!.areaPx2).toBeNull();
		expect(c.get('F')!.areaPx2).toEqual({ before: null, after: 6_400, change: 6_400 });
		expect(c.get('E')!.after).toBeNull();
		expect(c.get('E')!.iou).toBeNull();
		// No scales: no millimetres.
		expect(c.get('B')!.areaMm2).toBeNull();
		// Measurement marks are not damage and are not compared.
		expect(c.has('lvl')).toBe(false);
	});

	it('lists the largest area changes first, and the line changes apart', () => {
		expect(r.summary.biggestArea.map((c) => Math.abs(c.areaPx2!.change))).toEqual([12_500, 10_000, 10_000, 6_400, 5_000]);
		expect(idOf(r.summary.biggestArea[0]!)).toBe('B');
		expect(r.summary.biggestLength.map(idOf)).toEqual(['D']);
	});

	it('reports the thresholds it used, the exported defaults', () => {
		expect(r.thresholds.relative).toBe(NOISE_RELATIVE);
		expect(r.thresholds.absPx2).toBe(NOISE_ABS_PX2);
		expect(r.thresholds.minIoU).toBe(MATCH_MIN_IOU);
		// A stricter relative threshold turns B's +125 % into noise too.
		expect(byId(compareMarkLayers(before, after, { noiseThreshold: { relative: 2 } })).get('B')!.change).toBe('unchanged');
	});

	it('finds the same changes when the after photograph was taken from another angle and registered by control points', () => {
		// The after camera's view: before-photo px → after-photo px, with perspective (h20, h21 ≠ 0).
		const view: Matrix3 = [[0.92, 0.05, 140], [-0.03, 0.96, 90], [1.5e-5, 2.0e-5, 1]];
		const controls: P[] = [[200, 200], [4800, 250], [4700, 3600], [300, 3500], [2500, 1800]];
		const beforeWithControls = layerOf([...before.marks, ...controls.map((p, i) => ({ ...stamp, id: `c${i + 1}`, kind: 'control', n: i + 1, at: p }))]);
		const afterView = seenThrough(view, afterMarks, controls);
		// Without registration nothing lines up: the after marks are tens of pixels off or more.
		expect(compareMarkLayers(beforeWithControls, afterView).summary.counts.unchanged).toBeLessThan(4);
		const transform = fitHomography(pairsFromControlMarks(afterView, beforeWithControls));
		const registered = compareMarkLayers(beforeWithControls, afterView, { transform });
		expectClasses(registered, expectedClass);
		// Mapped back into the before photograph, areas and lengths are the hand-computed ones.
		const c = byId(registered);
		expect(c.get('B')!.areaPx2!.after).toBeCloseTo(22_500, 4);
		expect(c.get('C')!.areaPx2!.after).toBeCloseTo(15_000, 4);
		expect(c.get('D')!.lengthPx!.after).toBeCloseTo(500, 6);
	});
});

describe('compareMarkLayers with scales', () => {
	it('compares in mm² when both photographs have a scale, each measured with its own', () => {
		// The after photograph taken twice as close: every coordinate doubled, so its scale bar of
		// 100 mm spans 1,000 px (0.1 mm/px) where the before one spans 500 px (0.2 mm/px).
		const double = (p: P): P => [p[0] * 2, p[1] * 2];
		const scaleBar = (id: string, to: number) => ({ ...stamp, id, kind: 'scale', from: [0, 10], to: [to, 10], lengthMm: 100 });
		const b = layerOf([...before.marks, scaleBar('s', 500)]);
		const zoomed = afterMarks.map((m) => {
			if ('points' in m) return { ...m, points: (m.points as P[]).map(double) };
			if ('at' in m) return { ...m, at: double(m.at as P) };
			const box = m as unknown as { x: number; y: number; w: number; h: number };
			return { ...m, x: box.x * 2, y: box.y * 2, w: box.w * 2, h: box.h * 2 };
		});
		const a = layerOf([...zoomed, scaleBar('s', 1000)]);
		const r = compareMarkLayers(b, a, { transform: [[0.5, 0, 0], [0, 0.5, 0], [0, 0, 1]] });
		expect(r.basis).toEqual({ area: 'mm²', length: 'mm' });
		const c = byId(r);
		// B: 10,000 px² × 0.2² = 400 mm² before; 22,500 × 4 px² × 0.1² = 900 mm² after.
		expect(c.get('B')!.areaMm2!.before).toBeCloseTo(400, 9);
		expect(c.get('B')!.areaMm2!.after).toBeCloseTo(900, 9);
		expect(c.get('B')!.areaPx2).toEqual({ before: 10_000, after: 22_500, change: 12_500 });
		// D: 300 px × 0.2 = 60 mm before; 1,000 px × 0.1 = 100 mm after.
		expect(c.get('D')!.lengthMm!.change).toBeCloseTo(40, 9);
		// K: 400 px² × 0.04 = 16 mm² → 460 × 0.04 = 18.4 mm²: +2.4 mm² is above the 1 mm² floor, so
		// in mm² it has grown, where in px² its +60 px² was below the 100 px² floor.
		expect(c.get('K')!.areaMm2!.change).toBeCloseTo(2.4, 9);
		expect(c.get('K')!.change).toBe('grown');
		expect(c.get('A')!.change).toBe('unchanged');
		// Given scales override the scale bars; null means none, and back to px².
		expect(compareMarkLayers(b, a, { transform: [[0.5, 0, 0], [0, 0.5, 0], [0, 0, 1]], mmPerPx: { after: null } }).basis.area).toBe('px²');
	});
});

describe('compareMarkLayers matching', () => {
	it('matches the best overlap first, not the first mark that overlaps', () => {
		// After R (45,0)–(145,100) overlaps P (0,0)–(100,100) by 55 × 100 (IoU 5,500/14,500 ≈ 0.38) and
		// Q (50,0)–(150,100) by 95 × 100 (IoU 9,500/10,500 ≈ 0.90): R is Q, and P is gone.
		const b = layerOf([outline('P', 'seal', 'dried', sq(0, 0, 100)), outline('Q', 'seal', 'dried', sq(50, 0, 100))]);
		const a = layerOf([outline('R', 'seal', 'dried', sq(45, 0, 100))]);
		const c = byId(compareMarkLayers(b, a));
		expect(c.get('Q')!.after!.id).toBe('R');
		expect(c.get('Q')!.change).toBe('unchanged');
		expect(c.get('P')!.change).toBe('resolved');
	});

	it('needs the least overlap: below minIoU two marks are two damages', () => {
		// Offset squares of 100 sharing 10 × 100: IoU = 1,000 / 19,000 ≈ 0.053, below 0.1.
		const r = compareMarkLayers(layerOf([outline('X', 'seal', 'dried', sq(0, 0, 100))]), layerOf([outline('Y', 'seal', 'dried', sq(90, 0, 100))]));
		expect(r.summary.counts).toEqual({ new: 1, resolved: 1, grown: 0, shrunk: 0, unchanged: 0 });
		expect(compareMarkLayers(layerOf([outline('X', 'seal', 'dried', sq(0, 0, 100))]), layerOf([outline('Y', 'seal', 'dried', sq(90, 0, 100))]), { minIoU: 0.05 }).summary.counts.unchanged).toBe(1);
	});
});

describe('compareMarkLayers on invented layers of 200 marks', () => {
	it('finds every built change between photographs framed alike', () => {
		const { before: b, after: a, expected } = syntheticPair(200);
		const r = compareMarkLayers(b, a);
		expectClasses(r, expected);
		for (const fate of ['new', 'resolved', 'grown', 'shrunk', 'unchanged'] as const) expect(r.summary.counts[fate]).toBeGreaterThan(5);
	});

	it('finds them through a perspective view, registered by the layers’ control marks', () => {
		const view: Matrix3 = [[0.95, 0.04, 160], [-0.02, 0.93, 110], [-1.1e-5, 1.6e-5, 1]];
		const { before: b, after: a, expected } = syntheticPair(200, { perspective: view });
		expectClasses(compareMarkLayers(b, a, { transform: fitHomography(pairsFromControlMarks(a, b)) }), expected);
	});
});

describe('compareMarkLayers refuses bad options', () => {
	it('with a clear RangeError', () => {
		expect(() => compareMarkLayers(before, after, { transform: [[1, 0], [0, 1]] })).toThrow(/3 × 3/);
		expect(() => compareMarkLayers(before, after, { mmPerPx: { before: 0 } })).toThrow(/before photograph’s scale/);
		expect(() => compareMarkLayers(before, after, { minIoU: 0 })).toThrow(/minIoU/);
		expect(() => compareMarkLayers(before, after, { noiseThreshold: { absPx2: -1 } })).toThrow(/absPx2/);
	});
});
