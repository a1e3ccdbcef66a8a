/**
 * Registration of two photographs of one jar from control-point pairs: a perspective transform
 * (homography) or an affine one that carries one photo's pixels onto the other's, its inverse, and
 * how well it fits each pair.
 *
 * Matrix form. A transform is a 3 × 3 matrix as three rows, `number[][]`, acting on column vectors
 * [x, y, 1]ᵀ: x' = (h00·x + h01·y + h02) / w, y' = (h10·x + h11·y + h12) / w, with
 * w = h20·x + h21·y + h22. A homography is only defined up to scale, so it is returned scaled to
 * h22 = 1; an affine transform has the last row [0, 0, 1].
 */
import { Matrix, SVD, solve } from 'ml-matrix';
import type { XY } from '../marks/geometry.ts';
import { checkFinite, checkPairs, type PointPair } from './pairs.ts';

// Registration's whole interface in one module: the pairing lives in pairs.ts with its checks.
export { pairsFromControlMarks, type PointPair } from './pairs.ts';

export type Matrix3 = number[][];

export const identity = (): Matrix3 => [
	[1, 0, 0],
	[0, 1, 0],
	[0, 0, 1],
];

function mul(a: readonly (readonly number[])[], b: readonly (readonly number[])[]): Matrix3 {
	return [0, 1, 2].map((i) => [0, 1, 2].map((j) => a[i]![0]! * b[0]![j]! + a[i]![1]! * b[1]![j]! + a[i]![2]! * b[2]![j]!));
}

/** Divides by h22 so equal transforms compare equal; refuses one that sends the origin to infinity. */
function scaled(h: Matrix3): Matrix3 {
	const norm = Math.hypot(...h.flat());
	const last = h[2]![2]!;
	if (!(Math.abs(last) > 1e-12 * norm)) {
		throw new RangeError('The fitted transform sends the photograph’s top-left corner to infinity; check that the control points are paired with the right numbers.');
	}
	return h.map((row) => row.map((v) => v / last));
}

/** Refuses anything but three rows of three finite numbers. */
export function checkMatrix3(h: unknown): asserts h is Matrix3 {
	const ok = Array.isArray(h) && h.length === 3 && h.every((row) => Array.isArray(row) && row.length === 3 && row.every((v) => typeof v === 'number' && Number.isFinite(v)));
	if (!ok) throw new RangeError('A transform is a 3 × 3 matrix: three rows of three finite numbers.');
}

/**
 * Where the transform carries a point. A point on the line the transform sends to infinity (w = 0)
 * has no image and is a RangeError; for two photographs of one jar that line lies far outside both.
 */
export function applyHomography(h: readonly (readonly number[])[], p: XY): [number, number] {
	const [x, y] = p;
	const w = h[2]![0]! * x + h[2]![1]! * y + h[2]![2]!;
	if (w === 0 || !Number.isFinite(w)) throw new RangeError(`The point (${x}, ${y}) has no image under this transform: it lies on the line sent to infinity.`);
	return [(h[0]![0]! * x + h[0]![1]! * y + h[0]![2]!) / w, (h[1]![0]! * x + h[1]![1]! * y + h[1]![2]!) / w];
}

/** The inverse transform (the adjugate over the determinant), scaled to h22 = 1 when h22 is not 0. */
export function invertHomography(h: readonly (readonly number[])[]): Matrix3 {
	checkMatrix3(h);
	const [[a, b, c], [d, e, f], [g, k, l]] = h as [[number, number, number], [number, number, number], [number, number, number]];
	const adj = [
		[e * l - f * k, c * k - b * l, b * f - c * e],
		[f * g - d * l, a * l - c * g, c * d - a * f],
		[d * k - e * g, b * g - a * k, a * e - b * d],
	];
	const det = a * adj[0]![0]! + b * adj[1]![0]! + c * adj[2]![0]!;
	const norm = Math.hypot(...h.flat());
	if (!(Math.abs(det) > 1e-12 * norm ** 3)) throw new RangeError('This transform folds the photograph onto a line or a point and cannot be inverted.');
	const last = adj[2]![2]!;
	const s = Math.abs(last) > 1e-12 * Math.hypot(...adj.flat()) ? last : det;
	return adj.map((row) => row.map((v) => v / s));
}

/**
 * Hartley's normalisation: translate the points so their centroid is the origin and scale them so
 * their mean distance from it is √2. Without it the DLT's matrix mixes entries of order 1 and of
 * order 10⁸ (pixel coordinates squared) and the answer depends on where the origin is.
 */
function normaliser(points: readonly XY[]): Matrix3 {
	const n = points.length;
	const cx = points.reduce((s, p) => s + p[0], 0) / n;
	const cy = points.reduce((s, p) => s + p[1], 0) / n;
	const mean = points.reduce((s, p) => s + Math.hypot(p[0] - cx, p[1] - cy), 0) / n;
	const s = Math.SQRT2 / mean;
	return [
		[s, 0, -s * cx],
		[0, s, -s * cy],
		[0, 0, 1],
	];
}

/**
 * The homography that carries each pair's `from` point to its `to` point, by the normalised direct
 * linear transformation (Hartley & Zisserman, Multiple View Geometry, 2nd ed., algorithm 4.2): each
 * pair gives two rows of A·h = 0, and h is the right singular vector of A for its smallest singular
 * value. Exact for four pairs in general position, least squares (in the algebraic error) for more.
 * Needs at least 4 pairs, no three of four in line; bad input is a RangeError saying what to move.
 */
export function fitHomography(pairs: readonly PointPair[]): Matrix3 {
	checkPairs(pairs, { minimum: 4, what: 'perspective', allButOne: true });
	const tFrom = normaliser(pairs.map((p) => p.from));
	const tTo = normaliser(pairs.map((p) => p.to));
	const rows: number[][] = [];
	for (const p of pairs) {
		const [x, y] = applyHomography(tFrom, p.from);
		const [u, v] = applyHomography(tTo, p.to);
		rows.push([-x, -y, -1, 0, 0, 0, u * x, u * y, u], [0, 0, 0, -x, -y, -1, v * x, v * y, v]);
	}
	// ml-matrix gives the full 9 × 9 V only for at least as many rows as columns; zero rows change nothing.
	while (rows.length < 9) rows.push(new Array<number>(9).fill(0));
	const svd = new SVD(new Matrix(rows));
	const s = svd.diagonal;
	const order = s.map((_, i) => i).sort((i, j) => s[i]! - s[j]!);
	// A second (near-)zero singular value: the points leave a family of transforms, not one.
	if (!(s[order[1]!]! > 1e-10 * s[order[8]!]!)) {
		throw new RangeError('The control points do not fix a perspective transform (they are too nearly in line); spread them around the jar.');
	}
	const v = svd.rightSingularVectors.getColumn(order[0]!);
	const hNorm = [v.slice(0, 3), v.slice(3, 6), v.slice(6, 9)];
	return scaled(mul(mul(invertHomography(tTo), hNorm), tFrom));
}

/**
 * The affine transform (x' = a·x + b·y + c, y' = d·x + e·y + f) closest to the pairs in least squares,
 * in the `to` photograph's pixels. The `from` points are centred first, which leaves the answer the
 * same and keeps the system well conditioned with coordinates in the thousands. Needs 3 pairs not in
 * one line.
 */
export function fitAffine(pairs: readonly PointPair[]): Matrix3 {
	checkPairs(pairs, { minimum: 3, what: 'affine', allButOne: false });
	const n = pairs.length;
	const cx = pairs.reduce((s, p) => s + p.from[0], 0) / n;
	const cy = pairs.reduce((s, p) => s + p.from[1], 0) / n;
	const a = new Matrix(pairs.map((p) => [p.from[0] - cx, p.from[1] - cy, 1]));
	const b = new Matrix(pairs.map((p) => [p.to[0], p.to[1]]));
	// QR least squares for more than three pairs, LU for exactly three (ml-matrix's solve).
	const x = solve(a, b);
	const [[ax, dx], [ay, dy], [c0, f0]] = x.to2DArray() as [[number, number], [number, number], [number, number]];
	return [
		[ax, ay, c0 - ax * cx - ay * cy],
		[dx, dy, f0 - dx * cx - dy * cy],
		[0, 0, 1],
	];
}

/**
 * A pair whose error exceeds this many times the median error is flagged as probably misplaced or
 * misnumbered. The median, not the mean, so one bad pair does not raise the bar it is judged by;
 * a factor of about 3 is the usual choice (common practice, no published source).
 */
export const RESIDUAL_MEDIAN_FACTOR = 3;
/** Errors up to this many pixels are never flagged: a hand-placed point is not better (common practice, no published source). */
export const RESIDUAL_FLOOR_PX = 2;

export interface Residuals {
	/** |H·from − to| for each pair, px of the photograph mapped to. */
	errors: number[];
	/** Root mean square of the errors, px. */
	rms: number;
	median: number;
	/** The flagging limit: max(RESIDUAL_MEDIAN_FACTOR × median, RESIDUAL_FLOOR_PX). */
	limitPx: number;
	/** The flagged pairs, worst first: index into the pairs, control number when known, error px. */
	bad: { index: number; n: number | null; errorPx: number }[];
}

/**
 * How far each pair lands from where it should. With the fewest pairs the transform needs (4 for a
 * homography, 3 for an affine map) it fits them exactly and every error is 0: a misplaced point can
 * only show when there are spare pairs, so ask for one or two more than the minimum.
 */
export function residuals(h: readonly (readonly number[])[], pairs: readonly PointPair[]): Residuals {
	checkMatrix3(h);
	if (pairs.length === 0) throw new RangeError('Residuals need at least one pair of control points.');
	checkFinite(pairs);
	const errors = pairs.map((p) => {
		const [x, y] = applyHomography(h, p.from);
		return Math.hypot(x - p.to[0], y - p.to[1]);
	});
	const rms = Math.sqrt(errors.reduce((s, e) => s + e * e, 0) / errors.length);
	const sorted = [...errors].sort((a, b) => a - b);
	const mid = Math.floor(sorted.length / 2);
	const median = sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
	const limitPx = Math.max(RESIDUAL_MEDIAN_FACTOR * median, RESIDUAL_FLOOR_PX);
	const bad = errors
		.flatMap((errorPx, index) => (errorPx > limitPx ? [{ index, n: pairs[index]!.n ?? null, errorPx }] : []))
		.sort((p, q) => q.errorPx - p.errorPx);
	return { errors, rms, median, limitPx, bad };
}
