/**
 * Plane geometry for marks, in photo pixels: areas, lengths, hit tests, simplification of freehand
 * traces and the checks that keep an outline a simple polygon. Pure and dependency-free, so the
 * editor in the browser and the server's validation compute the same numbers.
 *
 * Frame. Photo pixels have their origin top left, x to the right and y DOWN (schema.ts). Every
 * formula here is the plain Cartesian one applied to the numbers as given; where orientation
 * matters (signedArea) the sign is stated for a y-up frame and translated to what it means on
 * screen.
 */

/**
 * Any point as the functions read it. A plain `[x, y]` tuple (the schema's `Point`) and both
 * branded kinds are assignable to it, so geometry accepts all three; the functions that combine
 * several points are generic in the point type, so a photo point and a screen point cannot meet
 * in one call.
 */
export type XY = readonly [number, number];

/** Pixels of the upright original photo (the space marks are stored in). */
export type PhotoPoint = [number, number] & { readonly __space: 'photo' };
/** CSS pixels of the drawing surface, origin at its top left. */
export type ScreenPoint = [number, number] & { readonly __space: 'screen' };

export const photoPoint = (x: number, y: number): PhotoPoint => [x, y] as PhotoPoint;
export const screenPoint = (x: number, y: number): ScreenPoint => [x, y] as ScreenPoint;

/**
 * How the photo sits on screen: `scale` screen px per photo px, and (`x`, `y`) the photo pixel
 * shown at the screen's top-left corner. Rotation is not modelled: photos are stored upright.
 */
export interface View {
	scale: number;
	x: number;
	y: number;
}

function checkScale(view: View): number {
	// A zero or negative scale would turn every pointer position into Infinity or a mirror image.
	if (!Number.isFinite(view.scale) || view.scale <= 0) throw new RangeError('The view scale must be a positive number of screen pixels per photo pixel.');
	return view.scale;
}

/** The photo pixel under a screen position (for pointer events). */
export function toPhoto(screen: ScreenPoint, view: View): PhotoPoint {
	const s = checkScale(view);
	return photoPoint(view.x + screen[0] / s, view.y + screen[1] / s);
}

/** Where a photo pixel is drawn on screen. */
export function toScreen(photo: PhotoPoint, view: View): ScreenPoint {
	const s = checkScale(view);
	return screenPoint((photo[0] - view.x) * s, (photo[1] - view.y) * s);
}

const dist = (a: XY, b: XY): number => Math.hypot(b[0] - a[0], b[1] - a[1]);

/** Twice the signed area of the triangle a, b, c: > 0 when a→b→c turns counter-clockwise in a y-up frame. */
const orient = (a: XY, b: XY, c: XY): number => (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);

/**
 * Shoelace formula, A = ½ Σ (xᵢ·yᵢ₊₁ − xᵢ₊₁·yᵢ), the polygon closed implicitly (last point back to
 * the first).
 *
 * Sign convention: positive when the vertices run counter-clockwise in a y-UP frame (the
 * mathematician's convention). Photo and screen pixels have y pointing DOWN, which mirrors the
 * picture, so a positive result means the outline runs CLOCKWISE as the user sees it on screen.
 *
 * Coordinates are taken relative to the first vertex: the value is the same in exact arithmetic,
 * but with photo coordinates near 10⁶ it keeps the products small and the rounding error with them.
 * Fewer than 3 points give 0.
 */
export function signedArea(points: readonly XY[]): number {
	const n = points.length;
	if (n < 3) return 0;
	const [ox, oy] = points[0]!;
	let twice = 0;
	for (let i = 1; i < n - 1; i++) {
		const a = points[i]!;
		const b = points[i + 1]!;
		twice += (a[0] - ox) * (b[1] - oy) - (b[0] - ox) * (a[1] - oy);
	}
	return twice / 2;
}

/**
 * Absolute area, px². For a self-intersecting outline this is the net of its lobes (a symmetric
 * bow-tie gives 0), which is why validOutline refuses crossings before an area is recorded.
 */
export function polygonArea(points: readonly XY[]): number {
	return Math.abs(signedArea(points));
}

/** Length of an open line through the points, px. */
export function polylineLength(points: readonly XY[]): number {
	let sum = 0;
	for (let i = 1; i < points.length; i++) sum += dist(points[i - 1]!, points[i]!);
	return sum;
}

/** Length of the closed outline through the points (last back to first), px. */
export function perimeter(points: readonly XY[]): number {
	if (points.length < 2) return 0;
	return polylineLength(points) + dist(points[points.length - 1]!, points[0]!);
}

/**
 * Area centroid of a simple polygon: Cx = Σ (xᵢ + xᵢ₊₁)(xᵢyᵢ₊₁ − xᵢ₊₁yᵢ) / 6A, likewise Cy.
 * A polygon with no area (a line, a point, fewer than 3 points) has no area centroid; the mean of
 * its vertices is returned instead, so a label can still be placed. Empty input is a RangeError.
 */
export function centroid(points: readonly XY[]): [number, number] {
	const n = points.length;
	if (n === 0) throw new RangeError('A centroid needs at least one point.');
	const [ox, oy] = points[0]!;
	let twice = 0;
	let cx = 0;
	let cy = 0;
	for (let i = 0; i < n; i++) {
		const a = points[i]!;
		const b = points[(i + 1) % n]!;
		const ax = a[0] - ox;
		const ay = a[1] - oy;
		const bx = b[0] - ox;
		const by = b[1] - oy;
		const cross = ax * by - bx * ay;
		twice += cross;
		cx += (ax + bx) * cross;
		cy += (ay + by) * cross;
	}
	const b = bounds(points);
	// "Zero" relative to the polygon's size: rounding leaves a residue of order ε·extent² in a sliver.
	if (Math.abs(twice) <= 1e-12 * Math.max(b.w, b.h) ** 2 || twice === 0) {
		let sx = 0;
		let sy = 0;
		for (const p of points) {
			sx += p[0];
			sy += p[1];
		}
		return [sx / n, sy / n];
	}
	return [ox + cx / (3 * twice), oy + cy / (3 * twice)];
}

export interface Bounds {
	x: number;
	y: number;
	w: number;
	h: number;
}

/** Axis-aligned bounding box (x, y its top-left in photo pixels). Empty input is a RangeError. */
export function bounds(points: readonly XY[]): Bounds {
	if (points.length === 0) throw new RangeError('Bounds need at least one point.');
	let minX = Infinity;
	let minY = Infinity;
	let maxX = -Infinity;
	let maxY = -Infinity;
	for (const [x, y] of points) {
		if (x < minX) minX = x;
		if (x > maxX) maxX = x;
		if (y < minY) minY = y;
		if (y > maxY) maxY = y;
	}
	return { x: minX, y: minY, w: maxX - minX, h: maxY - minY };
}

/** Shortest distance from p to the segment a–b, px (to the point a when a and b coincide). */
export function distanceToSegment(p: XY, a: XY, b: XY): number {
	const dx = b[0] - a[0];
	const dy = b[1] - a[1];
	const len2 = dx * dx + dy * dy;
	if (len2 === 0) return dist(p, a);
	// Project p onto the line, clamped to the segment.
	const t = Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len2));
	return Math.hypot(p[0] - (a[0] + t * dx), p[1] - (a[1] + t * dy));
}

/** Shortest distance from p to an open line through the points; Infinity for no points. */
export function distanceToPolyline(p: XY, points: readonly XY[]): number {
	if (points.length === 0) return Infinity;
	if (points.length === 1) return dist(p, points[0]!);
	let best = Infinity;
	for (let i = 1; i < points.length; i++) best = Math.min(best, distanceToSegment(p, points[i - 1]!, points[i]!));
	return best;
}

/** Points this close to an edge (px) count as on it; far below any pointer's precision. */
const ON_EDGE = 1e-9;

/**
 * Is p inside the polygon? Even-odd rule by crossing number: a ray from p to +x crosses the
 * boundary an odd number of times when p is inside; each edge is taken half-open in y so a ray
 * through a vertex is counted once. Points ON an edge or vertex (within 1e-9 px) count as inside,
 * so clicking exactly on an outline selects it. The polygon is closed implicitly.
 */
export function pointInPolygon<P extends XY>(p: P, polygon: readonly P[]): boolean {
	const n = polygon.length;
	if (n === 0) return false;
	if (n === 1) return dist(p, polygon[0]!) <= ON_EDGE;
	let inside = false;
	for (let i = 0, j = n - 1; i < n; j = i++) {
		const a = polygon[j]!;
		const b = polygon[i]!;
		if (distanceToSegment(p, a, b) <= ON_EDGE) return true;
		if (a[1] > p[1] !== b[1] > p[1]) {
			const xCross = a[0] + ((p[1] - a[1]) * (b[0] - a[0])) / (b[1] - a[1]);
			if (p[0] < xCross) inside = !inside;
		}
	}
	return inside;
}

/**
 * Marks, in place, the points of points[first..last] that Ramer–Douglas–Peucker keeps. Distances
 * are to the SEGMENT first–last, not its infinite line, so every dropped point lies within the
 * tolerance of the simplified line that replaces it (with the line's distance, a point beyond
 * an end could be dropped while far from the result). A stack instead of recursion: a 5000-point
 * trace must not depend on the call-stack depth.
 */
function rdpKeep(points: readonly XY[], first: number, last: number, tolerance: number, keep: boolean[]): void {
	const stack: [number, number][] = [[first, last]];
	while (stack.length > 0) {
		const [lo, hi] = stack.pop()!;
		let worst = -1;
		let worstAt = -1;
		for (let i = lo + 1; i < hi; i++) {
			const d = distanceToSegment(points[i]!, points[lo]!, points[hi]!);
			if (d > worst) {
				worst = d;
				worstAt = i;
			}
		}
		if (worstAt >= 0 && worst > tolerance) {
			keep[worstAt] = true;
			stack.push([lo, worstAt], [worstAt, hi]);
		}
	}
}

function checkTolerance(tolerance: number): void {
	if (!Number.isFinite(tolerance) || tolerance < 0) throw new RangeError('The simplification tolerance must be a number of pixels, 0 or more.');
}

/**
 * Ramer–Douglas–Peucker simplification of an open freehand trace: drops the points that lie within
 * `tolerance` px of the simplified line, always keeping the first and last points. Every original
 * point is within `tolerance` of the result. Returns a new array of the same point objects.
 */
export function simplify<P extends XY>(points: readonly P[], tolerance: number): P[] {
	checkTolerance(tolerance);
	if (points.length <= 2) return points.slice();
	const keep = points.map((_, i) => i === 0 || i === points.length - 1);
	rdpKeep(points, 0, points.length - 1, tolerance, keep);
	return points.filter((_, i) => keep[i]);
}

/**
 * RDP for a closed outline. A ring has no endpoints, so it is split at two anchors, the first
 * point and the point farthest from it, and each half is simplified between them. If the result
 * would be fewer than 3 points (the outline is thinner than the tolerance) the point farthest from
 * the anchors' segment is kept as well, so an outline with any area stays a triangle at least.
 * A repeated closing point (last equal to first) is dropped. Every original point is within
 * `tolerance` of the closed result.
 */
export function simplifyClosed<P extends XY>(points: readonly P[], tolerance: number): P[] {
	checkTolerance(tolerance);
	let ring = points.slice();
	while (ring.length > 1 && ring[0]![0] === ring[ring.length - 1]![0] && ring[0]![1] === ring[ring.length - 1]![1]) ring = ring.slice(0, -1);
	const n = ring.length;
	if (n <= 3) return ring;
	let far = 0;
	for (let i = 1; i < n; i++) if (dist(ring[i]!, ring[0]!) > dist(ring[far]!, ring[0]!)) far = i;
	if (far === 0) return [ring[0]!]; // all points coincide
	// Walk the ring once more to the first point, so the second half ends at the anchor.
	const walk: P[] = [...ring, ring[0]!];
	const keep = walk.map((_, i) => i === 0 || i === far || i === n);
	rdpKeep(walk, 0, far, tolerance, keep);
	rdpKeep(walk, far, n, tolerance, keep);
	if (keep.filter(Boolean).length - 1 < 3) {
		let extra = -1;
		let worst = -1;
		for (let i = 1; i < n; i++) {
			if (i === far) continue;
			const d = distanceToSegment(walk[i]!, walk[0]!, walk[far]!);
			if (d > worst) {
				worst = d;
				extra = i;
			}
		}
		if (extra > 0) {
			keep[extra] = true;
			// Re-run the half that now has three anchors, so each new segment is simplified properly.
			if (extra < far) {
				rdpKeep(walk, 0, extra, tolerance, keep);
				rdpKeep(walk, extra, far, tolerance, keep);
			} else {
				rdpKeep(walk, far, extra, tolerance, keep);
				rdpKeep(walk, extra, n, tolerance, keep);
			}
		}
	}
	return walk.slice(0, n).filter((_, i) => keep[i]);
}

/**
 * Two segments of a line or outline that meet where they should not. `a` and `b` are the 0-based
 * indices of each segment's start and end point in the array given; `at` is a point where they
 * meet (for an overlap, one point of the shared stretch), for the editor to highlight.
 */
export interface Crossing {
	a: readonly [number, number];
	b: readonly [number, number];
	at: [number, number];
}

interface Seg {
	i: number;
	j: number;
	p: XY;
	q: XY;
	k: number; // position in the de-duplicated sequence, for adjacency
	minX: number;
	maxX: number;
}

/** Is c, known to be collinear with a–b, within the segment's box (so on the segment)? */
const onSegment = (a: XY, b: XY, c: XY): boolean =>
	Math.min(a[0], b[0]) <= c[0] && c[0] <= Math.max(a[0], b[0]) && Math.min(a[1], b[1]) <= c[1] && c[1] <= Math.max(a[1], b[1]);

const sign = (v: number): number => (v > 0 ? 1 : v < 0 ? -1 : 0);

/** Where two non-adjacent segments meet, or null. Touching counts: a vertex on another edge makes the shape non-simple. */
function meet(s: Seg, t: Seg): [number, number] | null {
	const o1 = sign(orient(s.p, s.q, t.p));
	const o2 = sign(orient(s.p, s.q, t.q));
	const o3 = sign(orient(t.p, t.q, s.p));
	const o4 = sign(orient(t.p, t.q, s.q));
	if (o1 * o2 < 0 && o3 * o4 < 0) {
		const d = orient(s.p, s.q, t.q) - orient(s.p, s.q, t.p);
		const u = orient(s.p, s.q, t.q) / d; // weight of t.p: the crossing is u·t.p + (1 − u)·t.q
		return [u * t.p[0] + (1 - u) * t.q[0], u * t.p[1] + (1 - u) * t.q[1]];
	}
	if (o1 === 0 && onSegment(s.p, s.q, t.p)) return [t.p[0], t.p[1]];
	if (o2 === 0 && onSegment(s.p, s.q, t.q)) return [t.q[0], t.q[1]];
	if (o3 === 0 && onSegment(t.p, t.q, s.p)) return [s.p[0], s.p[1]];
	if (o4 === 0 && onSegment(t.p, t.q, s.q)) return [s.q[0], s.q[1]];
	return null;
}

/**
 * Adjacent segments u→v and v→w share v by construction; they only go wrong when the line doubles
 * back along itself (w collinear and on the u side of v), a collinear overlap.
 */
function foldsBack(u: XY, v: XY, w: XY): boolean {
	return orient(u, v, w) === 0 && (u[0] - v[0]) * (w[0] - v[0]) + (u[1] - v[1]) * (w[1] - v[1]) > 0;
}

/**
 * Every pair of segments that meet other than at the vertex adjacent segments share: proper
 * crossings, a vertex touching another segment, collinear overlaps (including a line doubling
 * back on itself). With `closed`, the segment from the last point back to the first is included.
 * Repeated consecutive points (zero-length segments, common at the end of a freehand stroke) are
 * skipped rather than reported. Segments are pruned by a sweep over their x-extents, so a
 * 5000-point outline is checked without comparing every pair.
 */
export function selfIntersections(points: readonly XY[], closed: boolean): Crossing[] {
	// Indices of the points that differ from the one before them.
	const idx: number[] = [];
	for (let i = 0; i < points.length; i++) {
		const prev = idx.length > 0 ? points[idx[idx.length - 1]!]! : null;
		if (!prev || prev[0] !== points[i]![0] || prev[1] !== points[i]![1]) idx.push(i);
	}
	if (closed && idx.length > 1) {
		const f = points[idx[0]!]!;
		const l = points[idx[idx.length - 1]!]!;
		if (f[0] === l[0] && f[1] === l[1]) idx.pop();
	}
	const m = idx.length;
	const segCount = closed ? (m >= 3 ? m : 0) : Math.max(0, m - 1);
	const segs: Seg[] = [];
	for (let k = 0; k < segCount; k++) {
		const i = idx[k]!;
		const j = idx[(k + 1) % m]!;
		const p = points[i]!;
		const q = points[j]!;
		segs.push({ i, j, p, q, k, minX: Math.min(p[0], q[0]), maxX: Math.max(p[0], q[0]) });
	}
	const adjacent = (a: number, b: number): boolean => Math.abs(a - b) === 1 || (closed && Math.abs(a - b) === segCount - 1);
	const found: Crossing[] = [];
	const sorted = [...segs].sort((s, t) => s.minX - t.minX);
	for (let x = 0; x < sorted.length; x++) {
		const s = sorted[x]!;
		for (let y = x + 1; y < sorted.length && sorted[y]!.minX <= s.maxX; y++) {
			const t = sorted[y]!;
			const [first, second] = s.k < t.k ? [s, t] : [t, s];
			let at: [number, number] | null = null;
			if (adjacent(first.k, second.k)) {
				// Which one comes first along the line decides which vertex they share.
				const [before, after] = second.k - first.k === 1 ? [first, second] : [second, first];
				// Two segments sharing a vertex lie on lines that meet only there, unless the lines are one.
				if (foldsBack(before.p, before.q, after.q)) at = [before.q[0], before.q[1]];
			} else {
				at = meet(first, second);
			}
			if (at) found.push({ a: [first.i, first.j], b: [second.i, second.j], at });
		}
	}
	return found.sort((c, d) => c.a[0] - d.a[0] || c.b[0] - d.b[0]);
}

export type OutlineCheck = { ok: true } | { ok: false; reason: string };

/**
 * Is this a usable outline: at least 3 distinct points, not all on one line, and not crossing
 * itself? Reasons are sentences for the person drawing, with points numbered from 1 as the editor
 * shows them. Collinearity is checked before crossings because a flat outline would otherwise be
 * reported as doubling back on itself, which is true but unhelpful.
 */
export function validOutline(points: readonly XY[]): OutlineCheck {
	if (points.some((p) => !Number.isFinite(p[0]) || !Number.isFinite(p[1]))) return { ok: false, reason: 'Every point of the outline must have finite coordinates.' };
	const distinct = new Set(points.map((p) => `${p[0]},${p[1]}`)).size;
	if (distinct < 3) return { ok: false, reason: `An outline needs at least 3 distinct points; this one has ${distinct}.` };
	const p0 = points[0]!;
	let far = p0;
	for (const p of points) if (dist(p, p0) > dist(far, p0)) far = p;
	const span2 = dist(p0, far) ** 2;
	// Flat within rounding: every point's offset from the line p0–far is negligible next to the outline's size.
	if (points.every((p) => Math.abs(orient(p0, far, p)) <= 1e-12 * span2)) return { ok: false, reason: 'The outline has no area: all its points lie on one line.' };
	const crossings = selfIntersections(points, true);
	if (crossings.length > 0) {
		const c = crossings[0]!;
		const seg = (s: readonly [number, number]) => `${s[0] + 1}–${s[1] + 1}`;
		const more = crossings.length > 1 ? ` (and ${crossings.length - 1} more place${crossings.length > 2 ? 's' : ''})` : '';
		return { ok: false, reason: `The outline crosses itself between points ${seg(c.a)} and ${seg(c.b)}${more}.` };
	}
	// A simple polygon whose points are not all collinear has area; this is a backstop for rounding.
	if (polygonArea(points) === 0) return { ok: false, reason: 'The outline has no area.' };
	return { ok: true };
}
