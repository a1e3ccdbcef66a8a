import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	bounds,
	centroid,
	distanceToPolyline,
	distanceToSegment,
	perimeter,
	photoPoint,
	pointInPolygon,
	polygonArea,
	polylineLength,
	screenPoint,
	selfIntersections,
	signedArea,
	simplify,
	simplifyClosed,
	toPhoto,
	toScreen,
	validOutline,
	type XY,
} from '../../../src/lib/marks/geometry.ts';

type P = [number, number];

/** Points with integer-ish coordinates in a photo-sized range, so exact sums stay exact. */
const coordinate = fc.integer({ min: -5000, max: 5000 });
const point = fc.tuple(coordinate, coordinate) as fc.Arbitrary<P>;
const polygon = fc.array(point, { minLength: 3, maxLength: 40 });

/** A star-shaped (hence simple) polygon: points at increasing angles round a centre, varied radii. */
const simplePolygon = fc
	.array(fc.integer({ min: 20, max: 400 }), { minLength: 3, maxLength: 30 })
	.map((radii): P[] => radii.map((r, i) => [1000 + r * Math.cos((2 * Math.PI * i) / radii.length), 800 + r * Math.sin((2 * Math.PI * i) / radii.length)]));

describe('signedArea and polygonArea (shoelace formula)', () => {
	it('gives 30 for the pentagon of the Rosetta Code task "Shoelace formula for polygonal area"', () => {
		// Rosetta Code, "Shoelace formula for polygonal area" (task text; rosettacode.org): the points
		// (3,4), (5,11), (12,8), (9,5), (5,6) have area 30. By hand, Σ(xᵢyᵢ₊₁ − xᵢ₊₁yᵢ) =
		// 13 − 92 − 12 + 29 + 2 = −60, so the signed area is −30: these run clockwise in a y-up frame.
		const pentagon: P[] = [[3, 4], [5, 11], [12, 8], [9, 5], [5, 6]];
		expect(signedArea(pentagon)).toBe(-30);
		expect(polygonArea(pentagon)).toBe(30);
	});

	it('gives 16.5 for the five-point example of the Wikipedia "Shoelace formula" article', () => {
		// Wikipedia, "Shoelace formula", worked example (from memory): (1,6), (3,1), (7,2), (4,4), (8,5).
		// Checked by hand: −17 − 1 + 20 − 12 + 43 = 33, area 33/2 = 16.5.
		expect(polygonArea([[1, 6], [3, 1], [7, 2], [4, 4], [8, 5]])).toBe(16.5);
	});

	it('is positive for counter-clockwise order in a y-up frame, which is clockwise on screen', () => {
		// Rectangle area w·h (elementary geometry). (0,0)→(60,0)→(60,30)→(0,30) turns left with y up.
		const box: P[] = [[0, 0], [60, 0], [60, 30], [0, 30]];
		expect(signedArea(box)).toBe(1800);
		expect(signedArea([...box].reverse())).toBe(-1800);
	});

	it('gives ½·base·height for a right triangle', () => {
		// Triangle area ½bh (elementary geometry): legs 3 and 4 → 6.
		expect(polygonArea([[0, 0], [3, 0], [0, 4]])).toBe(6);
	});

	it('returns 0 area for a degenerate polygon', () => {
		expect(signedArea([])).toBe(0);
		expect(signedArea([[1, 1], [5, 5]])).toBe(0);
		expect(polygonArea([[0, 0], [1, 1], [2, 2]])).toBe(0);
	});

	it('keeps full precision far from the origin (coordinates near the 10⁶ px limit)', () => {
		const far: P[] = [[999_000.5, 999_000.25], [999_001.5, 999_000.25], [999_001.5, 999_001.25], [999_000.5, 999_001.25]];
		expect(polygonArea(far)).toBe(1);
	});

	it('does not change when the vertex list is rotated cyclically', () => {
		fc.assert(
			fc.property(polygon, fc.nat(), (pts, k) => {
				const s = k % pts.length;
				const rotated = [...pts.slice(s), ...pts.slice(0, s)];
				expect(signedArea(rotated)).toBeCloseTo(signedArea(pts), 6);
			}),
		);
	});

	it('does not change under translation', () => {
		fc.assert(
			fc.property(polygon, coordinate, coordinate, (pts, dx, dy) => {
				const moved = pts.map(([x, y]): P => [x + dx, y + dy]);
				expect(signedArea(moved)).toBeCloseTo(signedArea(pts), 6);
			}),
		);
	});

	it('flips sign when the vertex order is reversed', () => {
		fc.assert(
			fc.property(polygon, (pts) => {
				expect(signedArea([...pts].reverse()) + signedArea(pts)).toBeCloseTo(0, 6);
			}),
		);
	});

	it('multiplies by k² when the polygon is scaled by k', () => {
		fc.assert(
			fc.property(polygon, fc.integer({ min: -20, max: 20 }), (pts, k) => {
				const scaled = pts.map(([x, y]): P => [k * x, k * y]);
				// Integer coordinates keep the sums exact; compare as numbers so 0 and −0 are equal.
				expect(signedArea(scaled) === k * k * signedArea(pts)).toBe(true);
			}),
		);
	});
});

describe('lengths', () => {
	it('measures a 3-4-5 right triangle: the open path 7, the closed outline 12', () => {
		// Pythagoras, 3² + 4² = 5² (elementary geometry).
		const tri: P[] = [[0, 0], [3, 0], [3, 4]];
		expect(polylineLength(tri)).toBe(7);
		expect(perimeter(tri)).toBe(12);
	});

	it('gives 0 for a single point or none', () => {
		expect(polylineLength([])).toBe(0);
		expect(polylineLength([[4, 4]])).toBe(0);
		expect(perimeter([[4, 4]])).toBe(0);
	});
});

describe('centroid', () => {
	it('puts a triangle’s centroid at the mean of its vertices', () => {
		// A triangle's centroid is the mean of its vertices (elementary geometry): (0+3+0)/3, (0+0+3)/3.
		const [x, y] = centroid([[0, 0], [3, 0], [0, 3]]);
		expect(x).toBeCloseTo(1, 12);
		expect(y).toBeCloseTo(1, 12);
	});

	it('finds the centroid of an L-shape by the polygon formula, as decomposition gives by hand', () => {
		// Paul Bourke, "Calculating the area and centroid of a polygon" (1988), Cx = Σ(xᵢ+xᵢ₊₁)(xᵢyᵢ₊₁−xᵢ₊₁yᵢ)/6A
		// (from memory). By hand: the L of a 4×1 bar (area 4, centre (2, 0.5)) and a 1×3 post on its left
		// end (area 3, centre (0.5, 2.5)): Cx = (4·2 + 3·0.5)/7 = 9.5/7, Cy = (4·0.5 + 3·2.5)/7 = 9.5/7.
		const ell: P[] = [[0, 0], [4, 0], [4, 1], [1, 1], [1, 4], [0, 4]];
		expect(polygonArea(ell)).toBe(7);
		const [x, y] = centroid(ell);
		expect(x).toBeCloseTo(9.5 / 7, 12);
		expect(y).toBeCloseTo(9.5 / 7, 12);
	});

	it('does not depend on the winding direction', () => {
		const ell: P[] = [[0, 0], [4, 0], [4, 1], [1, 1], [1, 4], [0, 4]];
		const [x, y] = centroid([...ell].reverse());
		expect(x).toBeCloseTo(9.5 / 7, 12);
		expect(y).toBeCloseTo(9.5 / 7, 12);
	});

	it('falls back to the vertex mean when the polygon has no area', () => {
		expect(centroid([[0, 0], [2, 2], [4, 4]])).toEqual([2, 2]);
		expect(centroid([[5, 7]])).toEqual([5, 7]);
		expect(() => centroid([])).toThrow(RangeError);
	});

	it('moves with the polygon under translation', () => {
		fc.assert(
			fc.property(simplePolygon, coordinate, coordinate, (pts, dx, dy) => {
				const [x, y] = centroid(pts);
				const [mx, my] = centroid(pts.map(([a, b]): P => [a + dx, b + dy]));
				expect(mx - dx).toBeCloseTo(x, 6);
				expect(my - dy).toBeCloseTo(y, 6);
			}),
		);
	});
});

describe('bounds', () => {
	it('gives the top-left corner, width and height', () => {
		expect(bounds([[10, 40], [70, 20], [30, 90]])).toEqual({ x: 10, y: 20, w: 60, h: 70 });
		expect(bounds([[3, 4]])).toEqual({ x: 3, y: 4, w: 0, h: 0 });
		expect(() => bounds([])).toThrow(RangeError);
	});
});

describe('pointInPolygon (even-odd crossing number)', () => {
	// Crossing test: E. Haines, "Point in Polygon Strategies", Graphics Gems IV (1994), §1.4 (from memory).
	const square: P[] = [[0, 0], [10, 0], [10, 10], [0, 10]];
	// A U-shape: the notch between x = 4 and 6 above y = 3 is outside.
	const cup: P[] = [[0, 0], [10, 0], [10, 10], [6, 10], [6, 3], [4, 3], [4, 10], [0, 10]];

	it('finds points inside and outside a convex polygon', () => {
		expect(pointInPolygon([5, 5], square)).toBe(true);
		expect(pointInPolygon([11, 5], square)).toBe(false);
		expect(pointInPolygon([-0.001, 5], square)).toBe(false);
	});

	it('counts points on an edge or a vertex as inside', () => {
		expect(pointInPolygon([10, 5], square)).toBe(true);
		expect(pointInPolygon([0, 0], square)).toBe(true);
		expect(pointInPolygon([5, 10], square)).toBe(true);
	});

	it('finds the notch of a concave polygon outside and its arms inside', () => {
		expect(pointInPolygon([5, 8], cup)).toBe(false);
		expect(pointInPolygon([2, 8], cup)).toBe(true);
		expect(pointInPolygon([8, 8], cup)).toBe(true);
		expect(pointInPolygon([5, 1], cup)).toBe(true);
	});

	it('counts a ray through a vertex once (the half-open edge rule)', () => {
		// The ray from (2, 3) to +x passes through the notch's vertices (4, 3) and (6, 3).
		expect(pointInPolygon([2, 3], cup)).toBe(true);
		const diamond: P[] = [[5, 0], [10, 5], [5, 10], [0, 5]];
		expect(pointInPolygon([2, 5], diamond)).toBe(true);
		expect(pointInPolygon([-1, 5], diamond)).toBe(false);
	});

	it('agrees with the centroid being inside a convex polygon', () => {
		fc.assert(
			fc.property(fc.integer({ min: 3, max: 24 }), fc.integer({ min: 5, max: 500 }), (n, r) => {
				const regular = Array.from({ length: n }, (_, i): P => [r * Math.cos((2 * Math.PI * i) / n), r * Math.sin((2 * Math.PI * i) / n)]);
				expect(pointInPolygon(centroid(regular), regular)).toBe(true);
				expect(pointInPolygon([r * 1.01, 0], regular)).toBe(false);
			}),
		);
	});
});

describe('distances', () => {
	it('measures to the nearest point of a segment: perpendicular inside, to an end beyond it', () => {
		// Point-to-segment distance by clamped projection (elementary vector geometry); 3-4-5 beyond the end.
		expect(distanceToSegment([5, 3], [0, 0], [10, 0])).toBe(3);
		expect(distanceToSegment([13, 4], [0, 0], [10, 0])).toBe(5);
		expect(distanceToSegment([3, 4], [0, 0], [0, 0])).toBe(5);
	});

	it('measures to the nearest segment of a polyline', () => {
		const zig: P[] = [[0, 0], [10, 0], [10, 10]];
		expect(distanceToPolyline([12, 5], zig)).toBe(2);
		expect(distanceToPolyline([1, 1], [[4, 5]])).toBe(5);
		expect(distanceToPolyline([1, 1], [])).toBe(Infinity);
	});
});

describe('simplify (Ramer–Douglas–Peucker)', () => {
	// Douglas & Peucker, "Algorithms for the reduction of the number of points required to represent
	// a digitized line or its caricature", The Canadian Cartographer 10(2), 1973, 112–122 (from memory).
	it('drops points within the tolerance and keeps the corner', () => {
		const trace: P[] = [[0, 0], [5, 0.4], [10, 0], [10, 5], [10.3, 10]];
		expect(simplify(trace, 1)).toEqual([[0, 0], [10, 0], [10.3, 10]]);
		expect(simplify(trace, 0)).toEqual(trace);
	});

	it('keeps a point beyond the end of the chord even when it is close to the chord’s line', () => {
		// (14, 0) lies on the line through (0,0) and (10,0) but 4 px past the chord's end: dropping it would cut the trace short.
		const trace: P[] = [[0, 0], [14, 0], [10, 0]];
		expect(simplify(trace, 1)).toEqual(trace);
	});

	it('refuses a negative tolerance', () => {
		expect(() => simplify([[0, 0], [1, 1]], -1)).toThrow(RangeError);
	});

	it('never removes the endpoints and stays within the tolerance of every original point', () => {
		fc.assert(
			fc.property(fc.array(point, { minLength: 2, maxLength: 80 }), fc.double({ min: 0, max: 500, noNaN: true }), (pts, tol) => {
				const out = simplify(pts, tol);
				expect(out[0]).toBe(pts[0]);
				expect(out[out.length - 1]).toBe(pts[pts.length - 1]);
				for (const p of pts) expect(distanceToPolyline(p, out)).toBeLessThanOrEqual(tol + 1e-9);
				// The result is a subsequence of the input.
				let k = 0;
				for (const p of out) {
					while (k < pts.length && pts[k] !== p) k++;
					expect(k).toBeLessThan(pts.length);
					k++;
				}
			}),
		);
	});

	it('simplifies a closed outline to within the tolerance of every original point', () => {
		fc.assert(
			fc.property(simplePolygon, fc.double({ min: 0, max: 200, noNaN: true }), (pts, tol) => {
				const out = simplifyClosed(pts, tol);
				expect(out.length).toBeGreaterThanOrEqual(3);
				const ring = [...out, out[0]!];
				for (const p of pts) expect(distanceToPolyline(p, ring)).toBeLessThanOrEqual(tol + 1e-9);
			}),
		);
	});

	it('reduces a densely traced circle to a polygon and drops a repeated closing point', () => {
		const circle = Array.from({ length: 360 }, (_, i): P => [100 * Math.cos((i * Math.PI) / 180), 100 * Math.sin((i * Math.PI) / 180)]);
		const out = simplifyClosed([...circle, circle[0]!], 1);
		expect(out.length).toBeLessThan(40);
		expect(out.length).toBeGreaterThan(8);
		expect(out[0]).toBe(circle[0]);
		expect(out[out.length - 1]).not.toEqual(out[0]);
	});

	it('keeps a thin outline a triangle rather than collapsing it to a line', () => {
		const sliver: P[] = [[0, 0], [50, 1], [100, 0], [50, -1]];
		expect(simplifyClosed(sliver, 5).length).toBe(3);
	});
});

describe('selfIntersections and validOutline', () => {
	// Segment tests by orientation (cross-product signs): Cormen, Leiserson, Rivest & Stein,
	// Introduction to Algorithms, §33.1, SEGMENTS-INTERSECT (from memory).
	it('finds the crossing of a bow-tie', () => {
		const bowTie: P[] = [[0, 0], [10, 10], [10, 0], [0, 10]];
		const found = selfIntersections(bowTie, true);
		expect(found).toHaveLength(1);
		expect(found[0]).toMatchObject({ a: [0, 1], b: [2, 3], at: [5, 5] });
	});

	it('finds none in a convex polygon or a star-shaped one', () => {
		expect(selfIntersections([[0, 0], [10, 0], [10, 10], [0, 10]], true)).toEqual([]);
		fc.assert(
			fc.property(simplePolygon, (pts) => {
				expect(selfIntersections(pts, true)).toEqual([]);
			}),
		);
	});

	it('ignores the shared vertex of adjacent segments and repeated points', () => {
		expect(selfIntersections([[0, 0], [10, 0], [10, 0], [10, 10], [0, 10], [0, 0]], true)).toEqual([]);
		expect(selfIntersections([[0, 0], [5, 5], [10, 0]], false)).toEqual([]);
	});

	it('counts a collinear overlap and a line doubling back on itself', () => {
		// Segments 0–1 and 2–3 lie on y = 0 and share the stretch x = 4…6.
		expect(selfIntersections([[0, 0], [6, 0], [6, 5], [4, 0], [10, 0]], false).length).toBeGreaterThan(0);
		// A spike: the path goes out to (10, 0) and straight back along itself; the next segment then
		// starts on the first one, a touch.
		expect(selfIntersections([[0, 0], [10, 0], [5, 0], [5, 5]], false)).toEqual([
			{ a: [0, 1], b: [1, 2], at: [10, 0] },
			{ a: [0, 1], b: [2, 3], at: [5, 0] },
		]);
	});

	it('counts a vertex touching another edge', () => {
		// The vertex (5, 0) of the dent lies on the first edge (0,0)–(10,0).
		expect(selfIntersections([[0, 0], [10, 0], [10, 10], [5, 0], [0, 10]], true).length).toBeGreaterThan(0);
	});

	it('checks an open line without its closing segment', () => {
		const zigzag: P[] = [[0, 0], [10, 10], [10, 0], [0, 10]];
		expect(selfIntersections(zigzag, false)).toHaveLength(1);
		const hook: P[] = [[0, 0], [10, 0], [10, 10], [5, -5]];
		expect(selfIntersections(hook, false)).toHaveLength(1);
	});

	it('accepts a simple outline', () => {
		expect(validOutline([[0, 0], [10, 0], [10, 10]])).toEqual({ ok: true });
	});

	it('refuses fewer than 3 distinct points, no area and crossings, saying where', () => {
		expect(validOutline([[0, 0], [5, 5], [0, 0]])).toEqual({ ok: false, reason: 'An outline needs at least 3 distinct points; this one has 2.' });
		expect(validOutline([[0, 0], [5, 5], [10, 10]])).toEqual({ ok: false, reason: 'The outline has no area: all its points lie on one line.' });
		const eight: P[] = [[0, 0], [10, 0], [10, 10], [20, 10], [20, 20], [5, 20], [5, -5], [0, -5]];
		const r = validOutline(eight);
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.reason).toMatch(/^The outline crosses itself between points 1–2 and 6–7/);
		expect(validOutline([[0, 0], [10, 10], [10, 0], [0, 10]])).toEqual({ ok: false, reason: 'The outline crosses itself between points 1–2 and 3–4.' });
		expect(validOutline([[0, 0], [Number.NaN, 1], [1, 1]]).ok).toBe(false);
	});

	it('names the closing segment by its last and first points', () => {
		// A bow-tie listed from another corner: the closing edge 4→1, (0,0)–(10,10), crosses edge 2→3.
		expect(validOutline([[10, 10], [10, 0], [0, 10], [0, 0]])).toEqual({ ok: false, reason: 'The outline crosses itself between points 2–3 and 4–1.' });
	});
});

describe('photo and screen coordinates', () => {
	const view = { scale: 0.25, x: 2000, y: 1000 };

	it('maps a screen position to the photo pixel under it and back', () => {
		// Screen (100, 40) at 0.25 screen px per photo px from (2000, 1000): 2000 + 100/0.25, 1000 + 40/0.25.
		const p = toPhoto(screenPoint(100, 40), view);
		expect(p).toEqual([2400, 1160]);
		expect(toScreen(p, view)).toEqual([100, 40]);
	});

	it('round-trips any point', () => {
		fc.assert(
			fc.property(point, fc.double({ min: 0.01, max: 40, noNaN: true }), (xy, scale) => {
				const v = { scale, x: -300, y: 75 };
				const back = toPhoto(toScreen(photoPoint(xy[0], xy[1]), v), v);
				expect(back[0]).toBeCloseTo(xy[0], 6);
				expect(back[1]).toBeCloseTo(xy[1], 6);
			}),
		);
	});

	it('refuses a view with no scale', () => {
		expect(() => toPhoto(screenPoint(1, 1), { scale: 0, x: 0, y: 0 })).toThrow(RangeError);
	});

	it('accepts plain tuples and either space, but not the two spaces in one call (checked by tsc)', () => {
		const plain: XY[] = [[0, 0], [10, 0], [0, 10]];
		const photo = plain.map(([x, y]) => photoPoint(x, y));
		expect(polygonArea(photo)).toBe(50);
		expect(pointInPolygon(photoPoint(1, 1), photo)).toBe(true);
		expect(pointInPolygon([1, 1], photo)).toBe(true);
		// @ts-expect-error a screen point cannot be tested against an outline in photo pixels
		expect(pointInPolygon(screenPoint(1, 1), photo)).toBe(true);
		// @ts-expect-error nor passed where a photo point is expected
		toScreen(screenPoint(1, 1), view);
		const kept: ReturnType<typeof photoPoint>[] = simplify(photo, 1);
		expect(kept).toHaveLength(3);
	});
});
