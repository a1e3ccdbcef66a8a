import fc from 'fast-check';
import type { MultiPolygon } from 'polygon-clipping';
import { describe, expect, it } from 'vitest';
import { overlappingPairs } from '../../../src/lib/compare/grid.ts';
import { band, DISC_SIDES, intersectionArea, iou, mapShape, markRegion, markShape, PIN_RADIUS_PX, regionArea, shapeSize, unionArea, type Box } from '../../../src/lib/compare/overlap.ts';
import { MarkSchema, type DamageMark } from '../../../src/lib/marks/schema.ts';
import { stamp } from './synthetic.ts';

const square = (x: number, y: number, side: number): MultiPolygon => [[[[x, y], [x + side, y], [x + side, y + side], [x, y + side]]]];
const damage = (m: Record<string, unknown>) => MarkSchema.parse({ ...stamp, id: 'm', part: 'container', term: 'cracked', severity: 2, ...m }) as DamageMark;

describe('intersection over union', () => {
	it('gives 1/7 for two 2 × 2 squares offset by (1, 1)', () => {
		// Each square has area 4; they share the unit square [1,2]², area 1; the union is 4 + 4 − 1 = 7.
		const a = square(0, 0, 2);
		const b = square(1, 1, 2);
		expect(intersectionArea(a, b)).toBeCloseTo(1, 12);
		expect(unionArea(a, b)).toBeCloseTo(7, 12);
		expect(iou(a, b)).toBeCloseTo(1 / 7, 12);
	});

	it('gives 1/4 for a unit square inside a 2 × 2 one, 1 for a region with itself and 0 for regions apart', () => {
		// Inside: intersection 1, union 4.
		expect(iou(square(0.5, 0.5, 1), square(0, 0, 2))).toBeCloseTo(0.25, 12);
		expect(iou(square(3, 3, 5), square(3, 3, 5))).toBeCloseTo(1, 12);
		expect(iou(square(0, 0, 1), square(5, 5, 1))).toBe(0);
		// Touching along an edge shares no area.
		expect(iou(square(0, 0, 1), square(1, 0, 1))).toBe(0);
	});

	it('gives 1/2 for the triangle that is half of a square', () => {
		// Triangle (0,0) (2,0) (0,2): area ½·2·2 = 2, inside the square of area 4; IoU = 2/4.
		expect(iou([[[[0, 0], [2, 0], [0, 2]]]], square(0, 0, 2))).toBeCloseTo(0.5, 12);
	});

	it('is symmetric and between 0 and 1 for any two boxes', () => {
		const box = fc.record({ x: fc.integer({ min: 0, max: 50 }), y: fc.integer({ min: 0, max: 50 }), s: fc.integer({ min: 1, max: 30 }) });
		fc.assert(
			fc.property(box, box, (p, q) => {
				const a = square(p.x, p.y, p.s);
				const b = square(q.x, q.y, q.s);
				const v = iou(a, b);
				expect(v).toBeGreaterThanOrEqual(0);
				expect(v).toBeLessThanOrEqual(1);
				expect(iou(b, a)).toBeCloseTo(v, 12);
				// Axis-aligned squares overlap in the product of their overlaps along each axis.
				const ox = Math.max(0, Math.min(p.x + p.s, q.x + q.s) - Math.max(p.x, q.x));
				const oy = Math.max(0, Math.min(p.y + p.s, q.y + q.s) - Math.max(p.y, q.y));
				expect(v).toBeCloseTo((ox * oy) / (p.s ** 2 + q.s ** 2 - ox * oy), 10);
			}),
			{ numRuns: 200 },
		);
	});
});

describe('regions of marks', () => {
	it('measures a region with a hole as its outer ring less the hole', () => {
		// 10 × 10 less 4 × 4: 100 − 16 = 84 (shoelace on each ring).
		expect(regionArea([[[[0, 0], [10, 0], [10, 10], [0, 10]], [[3, 3], [3, 7], [7, 7], [7, 3]]]])).toBe(84);
	});

	it('takes a box as its rectangle and an outline as drawn', () => {
		expect(regionArea(markRegion(damage({ kind: 'box', x: 10, y: 20, w: 30, h: 40 })))).toBe(1200);
		expect(regionArea(markRegion(damage({ kind: 'outline', points: [[0, 0], [30, 0], [0, 40]] })))).toBe(600);
	});

	it('widens a straight line to a band: length × width plus the two half-discs at its ends', () => {
		// The ends are octagons of radius r = w/2, area 2√2·r², half of each outside the rectangle.
		// Regions are snapped to 1/1024 px for the clipping library, so areas agree to about 0.01 px².
		const w = 10;
		expect(regionArea(band([[0, 0], [100, 0]], w))).toBeCloseTo(100 * w + 2 * Math.SQRT2 * (w / 2) ** 2, 1);
		const path = damage({ kind: 'path', points: [[0, 0], [100, 0]] });
		expect(regionArea(markRegion(path, null, { pathWidthPx: 4 }))).toBeCloseTo(400 + 2 * Math.SQRT2 * 4, 1);
	});

	it('widens a bent line without counting the overlap at the bend twice', () => {
		// Two legs of 100 px at a right angle: each rectangle 100 × 10, the join a disc of radius 5
		// around the corner; the union is less than the sum of the pieces.
		const area = regionArea(band([[0, 0], [100, 0], [100, 100]], 10));
		expect(area).toBeGreaterThan(2 * 100 * 10 - 25);
		expect(area).toBeLessThan(2 * 100 * 10 + 2 * Math.SQRT2 * 25 + 25);
	});

	it('takes a pin as a 16-sided disc of the pin radius', () => {
		// A regular n-gon inscribed in a circle of radius r has area ½·n·r²·sin(2π/n).
		const r = PIN_RADIUS_PX;
		expect(regionArea(markRegion(damage({ kind: 'pin', at: [500, 500] })))).toBeCloseTo(0.5 * DISC_SIDES * r * r * Math.sin((2 * Math.PI) / DISC_SIDES), 1);
		expect(() => markRegion(damage({ kind: 'pin', at: [5, 5] }), null, { pinRadiusPx: 0 })).toThrow(/positive number of pixels/);
	});

	it('maps a box through a perspective transform to the quadrilateral of its mapped corners', () => {
		// x' = x / (0.001·x + 1), y' = y / (0.001·x + 1): the box 0 ≤ x ≤ 100, 0 ≤ y ≤ 100 goes to
		// (0,0) (90.909…,0) (90.909…,90.909…) (0,100), a right trapezoid of area (100 + 90.909…)/2 · 90.909….
		const h = [[1, 0, 0], [0, 1, 0], [0.001, 0, 1]];
		const mapped = mapShape(h, markShape(damage({ kind: 'box', x: 0, y: 0, w: 100, h: 100 })));
		expect(mapped.kind).toBe('area');
		const s = 100 / 1.1;
		expect(shapeSize(mapped)).toBeCloseTo(((100 + s) / 2) * s, 9);
		expect(regionArea(markRegion(damage({ kind: 'box', x: 0, y: 0, w: 100, h: 100 }), h))).toBeCloseTo(((100 + s) / 2) * s, 1);
	});
});

describe('overlappingPairs (the grid that finds candidate pairs)', () => {
	const boxOf = ([x, y, w, h]: [number, number, number, number]): Box => ({ minX: x, minY: y, maxX: x + w, maxY: y + h });
	const boxes = fc.array(fc.tuple(fc.integer({ min: -500, max: 5000 }), fc.integer({ min: -500, max: 5000 }), fc.integer({ min: 0, max: 400 }), fc.integer({ min: 0, max: 400 })).map(boxOf), { maxLength: 60 });

	it('finds exactly the overlapping pairs that comparing every pair finds', () => {
		fc.assert(
			fc.property(boxes, boxes, fc.option(fc.constant(boxOf([-1000, -1000, 9000, 9000]))), (a, b, huge) => {
				// A huge box (over more cells than the grid files a box under) must still be found.
				const left = huge ? [...a, huge] : a;
				const brute: [number, number][] = [];
				left.forEach((p, i) => b.forEach((q, j) => {
					if (p.minX <= q.maxX && q.minX <= p.maxX && p.minY <= q.maxY && q.minY <= p.maxY) brute.push([i, j]);
				}));
				expect(overlappingPairs(left, b)).toEqual(brute);
				expect(overlappingPairs(b, left).map(([i, j]) => [j, i]).sort((p, q) => p[0]! - q[0]! || p[1]! - q[1]!)).toEqual(brute);
			}),
			{ numRuns: 150 },
		);
	});

	it('finds nothing when either set is empty', () => {
		expect(overlappingPairs([], [boxOf([0, 0, 1, 1])])).toEqual([]);
		expect(overlappingPairs([boxOf([0, 0, 1, 1])], [])).toEqual([]);
	});
});
