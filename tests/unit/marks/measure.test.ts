import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { formatMm, formatMm2, markArea, markLength, measured, MEASUREMENT_CAVEAT, mmPerPixel } from '../../../src/lib/marks/measure.ts';
import { MarkLayerSchema, MarkSchema, type Mark, type MarkLayer } from '../../../src/lib/marks/schema.ts';

const common = { authorId: '6f1c2a8e-3b4d-4e5f-8a9b-0c1d2e3f4a5b', createdAt: '2026-12-04T10:00:00Z', updatedAt: '2026-12-04T10:00:00Z' };
const damage = { part: 'container', term: 'cracked', severity: 2, note: '' } as const;

const mark = (m: Record<string, unknown>): Mark => MarkSchema.parse({ ...common, ...m });
const layer = (...marks: Mark[]): MarkLayer => MarkLayerSchema.parse({ schemaVersion: 1, marks, comments: [] });

const scale = (from: [number, number], to: [number, number], lengthMm: number) => mark({ id: 'scale', kind: 'scale', from, to, lengthMm });
const box = mark({ id: 'b1', ...damage, kind: 'box', x: 100, y: 200, w: 60, h: 30 });

describe('mmPerPixel', () => {
	it('gives 1/6 mm per px for a 100 mm scale bar drawn over 600 px', () => {
		// Scale = known length ÷ measured length (definition of a map or drawing scale): 100 / 600.
		expect(mmPerPixel(layer(scale([100, 50], [700, 50], 100)))).toBeCloseTo(1 / 6, 15);
	});

	it('measures a slanting scale bar along its length', () => {
		// 3-4-5 triangle (Pythagoras): from (0,0) to (360, 480) is 600 px.
		expect(mmPerPixel(layer(scale([0, 0], [360, 480], 100)))).toBeCloseTo(1 / 6, 15);
	});

	it('is null without a scale bar, or when its ends coincide', () => {
		expect(mmPerPixel(layer(box))).toBeNull();
		// The schema refuses such a bar; mmPerPixel stays safe for a layer built without it.
		expect(mmPerPixel({ schemaVersion: 1, marks: [scale([5, 5], [5, 5], 10)], comments: [] })).toBeNull();
	});

	it('does not depend on the direction the scale bar was drawn', () => {
		fc.assert(
			fc.property(fc.tuple(fc.integer({ min: 0, max: 9000 }), fc.integer({ min: 0, max: 9000 })), fc.tuple(fc.integer({ min: 0, max: 9000 }), fc.integer({ min: 0, max: 9000 })), (a, b) => {
				fc.pre(a[0] !== b[0] || a[1] !== b[1]);
				expect(mmPerPixel(layer(scale(a, b, 50)))).toBe(mmPerPixel(layer(scale(b, a, 50))));
			}),
		);
	});
});

describe('markArea and markLength', () => {
	it('gives a box its width times height and an outline its shoelace area', () => {
		// Rectangle w·h; right triangle ½bh (elementary geometry).
		expect(markArea(box)).toBe(1800);
		expect(markArea(mark({ id: 'o1', ...damage, kind: 'outline', points: [[0, 0], [30, 0], [0, 40]] }))).toBe(600);
	});

	it('gives lines their length and other marks none', () => {
		const path = mark({ id: 'p1', ...damage, kind: 'path', points: [[0, 0], [30, 0], [30, 40]] });
		expect(markLength(path)).toBe(70);
		expect(markLength(mark({ id: 'l1', kind: 'level', level: 'fluid-line', from: [10, 500], to: [410, 470] }))).toBeCloseTo(Math.hypot(400, 30), 12);
		expect(markLength(box)).toBeNull();
		expect(markArea(path)).toBeNull();
		expect(markArea(mark({ id: 'pin', ...damage, kind: 'pin', at: [1, 1] }))).toBeNull();
		expect(markLength(mark({ id: 'c1', kind: 'control', n: 1, at: [1, 1] }))).toBeNull();
	});

	it('gives a line the same length drawn either way', () => {
		const pts: [number, number][] = [[0, 0], [12, 7], [40, 3], [41, 90]];
		const forth = mark({ id: 'p1', ...damage, kind: 'path', points: pts });
		const back = mark({ id: 'p2', ...damage, kind: 'path', points: [...pts].reverse() });
		expect(markLength(back)).toBeCloseTo(markLength(forth)!, 12);
	});
});

describe('measured', () => {
	it('gives a 60 × 30 px box 50 mm² at 1/6 mm per px', () => {
		// 1800 px² × (1/6 mm/px)² = 1800/36 = 50 mm² (areas scale with the square of the length scale).
		const m = measured(box, layer(scale([100, 50], [700, 50], 100), box));
		expect(m.areaPx2).toBe(1800);
		expect(m.areaMm2).toBeCloseTo(50, 12);
		expect(m.lengthPx).toBeNull();
		expect(m.lengthMm).toBeNull();
	});

	it('gives a 300 px crack 50 mm at 1/6 mm per px', () => {
		const crack = mark({ id: 'p1', ...damage, kind: 'path', points: [[0, 0], [180, 240]] });
		const m = measured(crack, layer(scale([100, 50], [700, 50], 100), crack));
		expect(m.lengthPx).toBe(300);
		expect(m.lengthMm).toBeCloseTo(50, 12);
	});

	it('reports the scale bar at its stated length', () => {
		const s = scale([0, 0], [7, 0], 10);
		expect(measured(s, layer(s)).lengthMm).toBe(10);
	});

	it('leaves the millimetre figures empty without a scale bar', () => {
		expect(measured(box, layer(box))).toEqual({ areaPx2: 1800, areaMm2: null, lengthPx: null, lengthMm: null });
	});
});

describe('formatting', () => {
	it('rounds to three significant figures with grouped thousands', () => {
		// Three significant figures: common practice, no published source.
		expect(formatMm(4.5678)).toBe('4.57 mm');
		expect(formatMm(45.67)).toBe('45.7 mm');
		expect(formatMm(1249.6)).toBe('1,250 mm');
		expect(formatMm(0.04567)).toBe('0.0457 mm');
		expect(formatMm(0)).toBe('0 mm');
		expect(formatMm(-0)).toBe('0 mm');
		expect(formatMm2(50)).toBe('50 mm²');
		expect(formatMm2(12_345)).toBe('12,300 mm²');
		expect(formatMm(Number.NaN)).toBe('—');
	});

	it('states the caveat about glass and fluid in plain words', () => {
		expect(MEASUREMENT_CAVEAT).toMatch(/approximate/);
		expect(MEASUREMENT_CAVEAT).toMatch(/scale bar/);
		expect(MEASUREMENT_CAVEAT).toMatch(/same plane as the specimen/);
	});
});
