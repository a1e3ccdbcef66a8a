/**
 * Control-point pairs: the same numbered point placed on two photographs of one jar, and the checks
 * that refuse a set of pairs no transform can be fitted to, with a message that says which points
 * to move. Kept apart from the fitting so registration.ts reads as the algorithm alone.
 */
import type { XY } from '../marks/geometry.ts';
import type { MarkLayer } from '../marks/schema.ts';

/** One point in the photograph mapped from and the same point in the photograph mapped to, photo px. */
export interface PointPair {
	from: XY;
	to: XY;
	/** The control point's number, when the pair came from control marks; used in messages. */
	n?: number;
}

/**
 * The control marks both layers have, paired by their number n, in increasing n: `from` is the point
 * in `layerA`, `to` the point in `layerB`. So `fitHomography(pairsFromControlMarks(a, b))` maps
 * photo A's pixels to photo B's. Numbers on one photo only are left out (the schema already refuses
 * two control marks with one number in a layer).
 */
export function pairsFromControlMarks(layerA: Pick<MarkLayer, 'marks'>, layerB: Pick<MarkLayer, 'marks'>): PointPair[] {
	const inB = new Map<number, XY>();
	for (const m of layerB.marks) if (m.kind === 'control') inB.set(m.n, m.at);
	const pairs: PointPair[] = [];
	for (const m of layerA.marks) {
		if (m.kind !== 'control') continue;
		const to = inB.get(m.n);
		if (to) pairs.push({ from: m.at, to, n: m.n });
	}
	return pairs.sort((p, q) => p.n! - q.n!);
}

const label = (pairs: readonly PointPair[], i: number): string => String(pairs[i]!.n ?? i + 1);

/** "1, 2 and 4": how the messages list points. */
function list(pairs: readonly PointPair[], indices: readonly number[]): string {
	const names = indices.map((i) => label(pairs, i));
	return names.length === 1 ? names[0]! : `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
}

/** Twice the signed area of the triangle a, b, c. */
const orient = (a: XY, b: XY, c: XY): number => (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);

/**
 * A point this close to a line, as a fraction of the spread of the points, counts as on it: 10⁻⁶ is
 * a hundredth of a pixel across a 10,000-px photograph, so only points that are in line to within
 * rounding are refused here; nearly-in-line sets are caught by the fit's own conditioning check.
 */
const IN_LINE = 1e-6;

/** Indices of the points on the line through points[a] and points[b]. */
function onLine(points: readonly XY[], a: number, b: number, tolerance: number): number[] {
	const p = points[a]!;
	const q = points[b]!;
	const len = Math.hypot(q[0] - p[0], q[1] - p[1]);
	return points.flatMap((c, i) => (Math.abs(orient(p, q, c)) / len <= tolerance ? [i] : []));
}

/**
 * The largest set of points on one line among those that matter: a line holding all but one point
 * holds at least two of any three (pigeonhole), so the lines through two of the first three points
 * are the only candidates, and the search is linear rather than over every triple.
 */
function mostInLine(points: readonly XY[]): number[] {
	let spread = 0;
	for (const p of points) spread = Math.max(spread, Math.hypot(p[0] - points[0]![0], p[1] - points[0]![1]));
	let best: number[] = [];
	for (const [a, b] of [[0, 1], [0, 2], [1, 2]] as const) {
		if (b >= points.length) continue;
		const found = onLine(points, a, b, IN_LINE * spread);
		if (found.length > best.length) best = found;
	}
	return best;
}

/** Refuses a pair with a coordinate that is not a finite number, naming it. */
export function checkFinite(pairs: readonly PointPair[]): void {
	pairs.forEach((p, i) => {
		if (![p.from?.[0], p.from?.[1], p.to?.[0], p.to?.[1]].every((v) => typeof v === 'number' && Number.isFinite(v))) {
			throw new RangeError(`Control point ${label(pairs, i)} has a coordinate that is not a finite number; place it again.`);
		}
	});
}

export interface PairRules {
	/** Pairs needed: 4 for a perspective transform, 3 for an affine one. */
	minimum: number;
	/** What is fitted, for the messages: "perspective" or "affine". */
	what: string;
	/**
	 * Whether all points but one on a line is already degenerate: true for a homography (no four of
	 * the points would then be in general position), false for an affine map (only all on one line is).
	 */
	allButOne: boolean;
}

/**
 * Refuses, with a RangeError a person can act on, a set of pairs no transform of the kind can be
 * fitted to: too few, a coordinate that is not a finite number, two points at one place, or points
 * in line, checked in each photograph.
 */
export function checkPairs(pairs: readonly PointPair[], rules: PairRules): void {
	if (!Array.isArray(pairs) || pairs.length < rules.minimum) {
		const n = Array.isArray(pairs) ? pairs.length : 0;
		throw new RangeError(
			`Place at least ${rules.minimum} pairs of control points (the same numbered point on both photographs) to fit a ${rules.what} transform; there ${n === 1 ? 'is' : 'are'} ${n}.`,
		);
	}
	checkFinite(pairs);
	for (const side of ['from', 'to'] as const) {
		const where = side === 'from' ? 'the photograph mapped from' : 'the photograph mapped to';
		const points = pairs.map((p) => p[side]);
		const seen = new Map<string, number>();
		points.forEach((p, i) => {
			const key = `${p[0]},${p[1]}`;
			const j = seen.get(key);
			if (j !== undefined) throw new RangeError(`Control points ${list(pairs, [j, i])} are at the same place in ${where}; move one of them.`);
			seen.set(key, i);
		});
		const inLine = mostInLine(points);
		if (inLine.length === points.length) {
			throw new RangeError(`All the control points lie on one line in ${where}; place some above and below it, spread around the jar.`);
		}
		if (rules.allButOne && inLine.length === points.length - 1) {
			const start = points.length === 4 ? 'Three of the points' : 'All but one of the points';
			throw new RangeError(
				`${start} (control points ${list(pairs, inLine)}) lie on one line in ${where}, so they cannot fix a perspective transform; move one off the line or add another pair away from it.`,
			);
		}
	}
}
