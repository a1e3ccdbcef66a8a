import { describe, expect, it } from 'vitest';
import { pairsFromControlMarks, type PointPair } from '../../../src/lib/compare/pairs.ts';
import { applyHomography, fitAffine, fitHomography, invertHomography, residuals, type Matrix3 } from '../../../src/lib/compare/registration.ts';
import { layerOf, stamp, xorshift } from './synthetic.ts';

type P = [number, number];

/** Every entry within `rel` of the expected one, relative to the matrix's largest entry. */
function expectMatrixClose(actual: Matrix3, expected: Matrix3, rel: number) {
	const scale = Math.max(...expected.flat().map(Math.abs));
	actual.forEach((row, i) => row.forEach((v, j) => expect(Math.abs(v - expected[i]![j]!)).toBeLessThanOrEqual(rel * scale)));
}

/** Standard normal deviates by the Box–Muller transform (Box & Muller 1958), from a seeded stream. */
function gaussian(seed: number): () => number {
	const u = xorshift(seed);
	return () => Math.sqrt(-2 * Math.log(1 - u())) * Math.cos(2 * Math.PI * u());
}

const pairsThrough = (h: Matrix3, from: P[]): PointPair[] => from.map((p) => ({ from: p, to: applyHomography(h, p) }));

/** A grid of points over a 6000 × 4000 photograph. */
const grid = (nx: number, ny: number): P[] => Array.from({ length: nx * ny }, (_, k): P => [300 + (k % nx) * (5400 / (nx - 1)), 200 + Math.floor(k / nx) * (3600 / (ny - 1))]);

// A perspective view: a small rotation, a shear, a shift and a tilt (h20, h21 ≠ 0).
const H: Matrix3 = [
	[1.04, 0.06, 35],
	[-0.03, 0.97, -20],
	[1.2e-5, -0.8e-5, 1],
];

describe('fitHomography', () => {
	it('matches Heckbert’s closed form for the unit square mapped to a quadrilateral', () => {
		// P. S. Heckbert (1989), Fundamentals of Texture Mapping and Image Warping, UC Berkeley, §2.2.3:
		// the square (0,0) (1,0) (1,1) (0,1) to (x0,y0)…(x3,y3) is x = (au + bv + c)/(gu + hv + 1),
		// y = (du + ev + f)/(gu + hv + 1), with Σx = x0 − x1 + x2 − x3, Δx1 = x1 − x2, Δx2 = x3 − x2 (and
		// the same in y), g = |Σx Δx2; Σy Δy2| / |Δx1 Δx2; Δy1 Δy2|, h = |Δx1 Σx; Δy1 Σy| / (the same),
		// a = x1 − x0 + g·x1, b = x3 − x0 + h·x3, c = x0, d = y1 − y0 + g·y1, e = y3 − y0 + h·y3, f = y0.
		const q: P[] = [[120, 80], [910, 140], [860, 700], [60, 620]];
		const [[x0, y0], [x1, y1], [x2, y2], [x3, y3]] = q as [P, P, P, P];
		const sx = x0 - x1 + x2 - x3;
		const sy = y0 - y1 + y2 - y3;
		const [dx1, dx2, dy1, dy2] = [x1 - x2, x3 - x2, y1 - y2, y3 - y2];
		const den = dx1 * dy2 - dx2 * dy1;
		const g = (sx * dy2 - dx2 * sy) / den;
		const h = (dx1 * sy - sx * dy1) / den;
		const heckbert: Matrix3 = [
			[x1 - x0 + g * x1, x3 - x0 + h * x3, x0],
			[y1 - y0 + g * y1, y3 - y0 + h * y3, y0],
			[g, h, 1],
		];
		const square: P[] = [[0, 0], [1, 0], [1, 1], [0, 1]];
		expectMatrixClose(fitHomography(square.map((p, i) => ({ from: p, to: q[i]! }))), heckbert, 1e-9);
	});

	it('recovers a known perspective transform to 1e-6 from noiseless points', () => {
		expectMatrixClose(fitHomography(pairsThrough(H, grid(4, 3))), H, 1e-6);
		// The tilt entries are small; check them on their own scale too.
		const fitted = fitHomography(pairsThrough(H, grid(4, 3)));
		expect(fitted[2]![0]!).toBeCloseTo(1.2e-5, 11);
		expect(fitted[2]![1]!).toBeCloseTo(-0.8e-5, 11);
	});

	it('recovers it from exactly four points, and maps them exactly', () => {
		const four: P[] = [[500, 400], [5600, 350], [5500, 3700], [450, 3800]];
		const pairs = pairsThrough(H, four);
		expectMatrixClose(fitHomography(pairs), H, 1e-6);
		expect(residuals(fitHomography(pairs), pairs).rms).toBeLessThan(1e-6);
	});

	it('leaves a residual near the noise level with noisy points', () => {
		// Hartley & Zisserman, Multiple View Geometry (2nd ed., 2004), §5.1.2: with Gaussian noise σ in
		// one image, the expected RMS residual per coordinate is ε = σ·(1 − d/N)^½ for d = 8 parameters
		// and N = 2n measurements; per point (two coordinates) it is √2·ε.
		const sigma = 0.8;
		const noise = gaussian(7);
		const from = grid(10, 8);
		const pairs = from.map((p): PointPair => {
			const [x, y] = applyHomography(H, p);
			return { from: p, to: [x + sigma * noise(), y + sigma * noise()] };
		});
		const expected = Math.SQRT2 * sigma * Math.sqrt(1 - 8 / (2 * from.length));
		const r = residuals(fitHomography(pairs), pairs);
		expect(r.rms).toBeGreaterThan(0.85 * expected);
		expect(r.rms).toBeLessThan(1.15 * expected);
		// And the fit is close to the truth: a corner lands within a couple of σ.
		const [cx, cy] = applyHomography(fitHomography(pairs), [6000, 4000]);
		const [tx, ty] = applyHomography(H, [6000, 4000]);
		expect(Math.hypot(cx - tx, cy - ty)).toBeLessThan(2 * sigma);
	});

	it('gives the affine transform when the points were moved by one', () => {
		// An affine map is a homography with last row [0, 0, 1] (H&Z §2.4.3).
		const A: Matrix3 = [[0.9, -0.2, 140], [0.15, 1.1, -60], [0, 0, 1]];
		expectMatrixClose(fitHomography(pairsThrough(A, grid(3, 3))), A, 1e-9);
	});
});

describe('fitAffine', () => {
	// Rotation by 25°, scales 1.3 and 0.8, a shear of 0.1, a shift (x' = a·x + b·y + c, y' = d·x + e·y + f).
	const t = (25 * Math.PI) / 180;
	const A: Matrix3 = [
		[1.3 * Math.cos(t), -0.8 * Math.sin(t) + 0.1, 412.5],
		[1.3 * Math.sin(t), 0.8 * Math.cos(t), -87.25],
		[0, 0, 1],
	];

	it('recovers a known affine transform from three points and from many', () => {
		expectMatrixClose(fitAffine(pairsThrough(A, [[100, 100], [5000, 300], [2500, 3900]])), A, 1e-12);
		expectMatrixClose(fitAffine(pairsThrough(A, grid(5, 4))), A, 1e-12);
	});

	it('is the least-squares fit: the residuals are orthogonal to x, y and 1 (the normal equations)', () => {
		// Least squares minimises |Ax − b|² exactly when Aᵀ(Ax − b) = 0 (e.g. Björck, Numerical Methods for Least Squares Problems, 1996, §1.1).
		const noise = gaussian(11);
		const pairs = pairsThrough(A, grid(6, 5)).map((p): PointPair => ({ from: p.from, to: [p.to[0] + 3 * noise(), p.to[1] + 3 * noise()] }));
		const fitted = fitAffine(pairs);
		expect(fitted[2]).toEqual([0, 0, 1]);
		for (const axis of [0, 1]) {
			const r = pairs.map((p) => applyHomography(fitted, p.from)[axis]! - p.to[axis]!);
			const dot = (f: (p: PointPair) => number) => pairs.reduce((s, p, i) => s + f(p) * r[i]!, 0);
			expect(Math.abs(dot(() => 1))).toBeLessThan(1e-6);
			expect(Math.abs(dot((p) => p.from[0]))).toBeLessThan(1e-2);
			expect(Math.abs(dot((p) => p.from[1]))).toBeLessThan(1e-2);
		}
	});
});

describe('invertHomography and applyHomography', () => {
	it('undoes the transform: H⁻¹(H(p)) = p, and H·H⁻¹ is the identity up to scale', () => {
		const inv = invertHomography(H);
		for (const p of grid(3, 3)) {
			const back = applyHomography(inv, applyHomography(H, p));
			expect(back[0]).toBeCloseTo(p[0], 8);
			expect(back[1]).toBeCloseTo(p[1], 8);
		}
		const product = [0, 1, 2].map((i) => [0, 1, 2].map((j) => [0, 1, 2].reduce((s, k) => s + H[i]![k]! * inv[k]![j]!, 0)));
		expectMatrixClose(product.map((row) => row.map((v) => v / product[2]![2]!)), [[1, 0, 0], [0, 1, 0], [0, 0, 1]], 1e-12);
	});

	it('refuses a transform that folds the plane, and a point sent to infinity', () => {
		expect(() => invertHomography([[1, 2, 3], [2, 4, 6], [0, 0, 1]])).toThrow(RangeError);
		// w = 0.001·x + 0·y − 1 is 0 at x = 1000.
		expect(() => applyHomography([[1, 0, 0], [0, 1, 0], [0.001, 0, -1]], [1000, 5])).toThrow(/no image/);
		expect(() => invertHomography([[1, 0], [0, 1]])).toThrow(/3 × 3/);
	});
});

describe('residuals', () => {
	it('flags a misplaced point and no other', () => {
		const pairs = pairsThrough(H, grid(4, 3)).map((p, i): PointPair => ({ ...p, n: i + 1, to: i === 5 ? [p.to[0] + 60, p.to[1] - 45] : p.to }));
		const r = residuals(fitHomography(pairs), pairs);
		expect(r.bad.map((b) => b.n)).toEqual([6]);
		expect(r.errors.length).toBe(12);
		// RMS is the root of the mean square, from its definition.
		expect(r.rms).toBeCloseTo(Math.sqrt(r.errors.reduce((s, e) => s + e * e, 0) / 12), 12);
		expect(r.limitPx).toBeCloseTo(Math.max(3 * r.median, 2), 12);
	});

	it('refuses no pairs, and a pair that is not a pair of finite points', () => {
		expect(() => residuals(H, [])).toThrow(/at least one pair/);
		expect(() => residuals(H, [{ from: [1, Number.POSITIVE_INFINITY], to: [1, 1], n: 4 }])).toThrow(/Control point 4 has a coordinate that is not a finite number/);
	});

	it('flags nothing when every pair fits to within the 2 px floor', () => {
		const noise = gaussian(3);
		const pairs = pairsThrough(H, grid(4, 4)).map((p): PointPair => ({ from: p.from, to: [p.to[0] + 0.3 * noise(), p.to[1] + 0.3 * noise()] }));
		expect(residuals(fitHomography(pairs), pairs).bad).toEqual([]);
	});
});

describe('bad control points', () => {
	const four: P[] = [[100, 100], [900, 120], [880, 700], [90, 680]];
	const numbered = (from: P[], to: P[] = from): PointPair[] => from.map((p, i) => ({ from: p, to: to[i]!, n: i + 1 }));

	it('asks for at least four pairs for a perspective transform and three for an affine one', () => {
		expect(() => fitHomography(numbered(four.slice(0, 3)))).toThrow(/Place at least 4 pairs of control points.*there are 3/);
		expect(() => fitAffine(numbered(four.slice(0, 2)))).toThrow(/Place at least 3 pairs/);
		expect(() => fitHomography([])).toThrow(/there are 0/);
	});

	it('refuses a coordinate that is not a finite number, naming the point', () => {
		expect(() => fitHomography(numbered(four, [four[0]!, [Number.NaN, 4], four[2]!, four[3]!]))).toThrow(/Control point 2 has a coordinate that is not a finite number/);
	});

	it('refuses two points at one place', () => {
		expect(() => fitHomography(numbered([four[0]!, four[1]!, four[0]!, four[3]!], four))).toThrow(/Control points 1 and 3 are at the same place in the photograph mapped from/);
	});

	it('refuses three of four points in one line, naming them', () => {
		// (100,100), (500,110), (900,120) are in line: the slope is 10/400 = 20/800.
		const bent: P[] = [[100, 100], [500, 110], [900, 120], [300, 700]];
		expect(() => fitHomography(numbered(four, bent))).toThrow(/Three of the points \(control points 1, 2 and 3\) lie on one line in the photograph mapped to/);
		// An affine transform needs only three points off one line, which these are.
		expect(() => fitAffine(numbered(four, bent))).not.toThrow();
	});

	it('refuses all the points in one line, and all but one of five', () => {
		const line: P[] = [[0, 0], [100, 50], [200, 100], [300, 150], [400, 200]];
		expect(() => fitAffine(numbered(line))).toThrow(/All the control points lie on one line/);
		expect(() => fitHomography(numbered([...line.slice(0, 4), [50, 400]]))).toThrow(/All but one of the points \(control points 1, 2, 3 and 4\)/);
	});
});

describe('pairsFromControlMarks', () => {
	it('pairs control marks by number, in increasing number, leaving out numbers on one photograph only', () => {
		const control = (n: number, at: P) => ({ ...stamp, id: `c${n}`, kind: 'control', n, at });
		const a = layerOf([control(3, [30, 3]), control(1, [10, 1]), control(7, [70, 7]), { ...stamp, id: 'p', kind: 'pin', part: 'lid', term: 'loose', severity: 1, at: [5, 5] }]);
		const b = layerOf([control(1, [11, 2]), control(3, [31, 4]), control(9, [90, 9])]);
		expect(pairsFromControlMarks(a, b)).toEqual([
			{ from: [10, 1], to: [11, 2], n: 1 },
			{ from: [30, 3], to: [31, 4], n: 3 },
		]);
	});
});
