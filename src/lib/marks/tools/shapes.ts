import { distanceToPolyline, distanceToSegment, pointInPolygon, validOutline } from '../geometry.ts';
import { MAX_VERTICES_PER_MARK, type Mark, type Point } from '../schema.ts';
import type { GeometryPatch } from './effects.ts';
import type { ToolContext } from './events.ts';
import { distance, rectBetween } from './common.ts';

/** What the Select tool needs to know about each kind of mark: where it is hit, its handles, how it moves. */

const corners = (r: { x: number; y: number; w: number; h: number }): Point[] => [
	[r.x, r.y],
	[r.x + r.w, r.y],
	[r.x + r.w, r.y + r.h],
	[r.x, r.y + r.h],
];

/** Closed outline as an open polyline back to its start, for distances to its edges. */
const ring = (points: Point[]): Point[] => (points.length > 0 ? [...points, points[0]!] : points);

/**
 * How a point hits a mark: 'edge' when it is within the tolerance of what is drawn (an outline's
 * edge, a line, a pin), 'inside' when it is inside an outline or box but away from its edges.
 */
export function hitMark(m: Mark, p: Point, tol: number): 'edge' | 'inside' | null {
	switch (m.kind) {
		case 'outline':
			return distanceToPolyline(p, ring(m.points)) <= tol ? 'edge' : pointInPolygon(p, m.points) ? 'inside' : null;
		case 'box':
		case 'grey': {
			const c = corners(m);
			return distanceToPolyline(p, ring(c)) <= tol ? 'edge' : pointInPolygon(p, c) ? 'inside' : null;
		}
		case 'path':
			return distanceToPolyline(p, m.points) <= tol ? 'edge' : null;
		case 'scale':
		case 'level':
			return distanceToSegment(p, m.from, m.to) <= tol ? 'edge' : null;
		case 'pin':
		case 'control':
			return distance(p, m.at) <= tol ? 'edge' : null;
	}
}

/**
 * The mark a click at p means, or null. The topmost mark whose drawn edge or point is within the
 * tolerance wins; only if none is, the topmost whose inside contains p. Without the first pass a
 * large outline drawn last would hide every pin and line inside it from the pointer.
 */
export function hitTest(marks: readonly Mark[], p: Point, tol: number): string | null {
	let inside: string | null = null;
	for (let i = marks.length - 1; i >= 0; i--) {
		const m = marks[i]!;
		const hit = hitMark(m, p, tol);
		if (hit === 'edge') return m.id;
		if (hit === 'inside' && inside === null) inside = m.id;
	}
	return inside;
}

/** The draggable vertices of a mark, in order: outline and line points, box corners, line ends. Pins have none (they move whole). */
export function handles(m: Mark): Point[] {
	switch (m.kind) {
		case 'outline':
		case 'path':
			return m.points;
		case 'box':
		case 'grey':
			return corners(m);
		case 'scale':
		case 'level':
			return [m.from, m.to];
		case 'pin':
		case 'control':
			return [];
	}
}

/** The index of the handle nearest p within the tolerance, or -1. */
export function handleAt(m: Mark, p: Point, tol: number): number {
	let best = -1;
	let bestD = tol;
	handles(m).forEach((h, i) => {
		const d = distance(h, p);
		if (d <= bestD) {
			best = i;
			bestD = d;
		}
	});
	return best;
}

const shift = (p: Point, dx: number, dy: number): Point => [p[0] + dx, p[1] + dy];

/** The patch that moves a mark by (dx, dy). */
export function translate(m: Mark, dx: number, dy: number): GeometryPatch {
	switch (m.kind) {
		case 'outline':
		case 'path':
			return { points: m.points.map((p) => shift(p, dx, dy)) };
		case 'box':
		case 'grey':
			return { x: m.x + dx, y: m.y + dy };
		case 'scale':
		case 'level':
			return { from: shift(m.from, dx, dy), to: shift(m.to, dx, dy) };
		case 'pin':
		case 'control':
			return { at: shift(m.at, dx, dy) };
	}
}

/** The patch that puts handle `index` at `to`; a box corner keeps the opposite corner where it is. */
export function moveHandle(m: Mark, index: number, to: Point, ctx: ToolContext): GeometryPatch {
	switch (m.kind) {
		case 'outline':
		case 'path':
			return { points: m.points.map((p, i) => (i === index ? to : p)) };
		case 'box':
		case 'grey':
			return rectBetween(corners(m)[(index + 2) % 4]!, to, false, ctx);
		case 'scale':
		case 'level':
			return index === 0 ? { from: to } : { to };
		case 'pin':
		case 'control':
			return {};
	}
}

/** A mark with a patch applied, for previews (apply.ts does the same with validation and times). */
export const patched = (m: Mark, patch: GeometryPatch): Mark => ({ ...m, ...patch }) as Mark;

export type Check = { ok: true } | { ok: false; reason: string };

/** Is the mark still drawable after an edit? The schema checks counts; this checks the shape. */
export function checkShape(m: Mark, tol: number): Check {
	switch (m.kind) {
		case 'outline':
			return validOutline(m.points);
		case 'path':
			return m.points.some((p) => distance(p, m.points[0]!) > 0) ? { ok: true } : { ok: false, reason: 'A line needs two different points.' };
		case 'box':
		case 'grey':
			return m.w >= tol && m.h >= tol ? { ok: true } : { ok: false, reason: 'That would make the box too small to see.' };
		case 'scale':
		case 'level':
			return distance(m.from, m.to) > tol ? { ok: true } : { ok: false, reason: 'The two ends of the line would meet.' };
		case 'pin':
		case 'control':
			return { ok: true };
	}
}

/** Fewest points of an outline and a line (the schema's minimums). */
const MIN_POINTS = { outline: 3, path: 2 } as const;

/**
 * Alt-click on an outline or line: on a vertex removes it (not below the minimum), on an edge
 * inserts one at the click. Returns the patch, a refusal, or null when p is on neither.
 */
export function altEdit(m: Mark, p: Point, tol: number): { patch: GeometryPatch } | { refused: string } | null {
	if (m.kind !== 'outline' && m.kind !== 'path') return null;
	const pts = m.points;
	const v = handleAt(m, p, tol);
	if (v >= 0) {
		const min = MIN_POINTS[m.kind];
		if (pts.length <= min) return { refused: `${m.kind === 'outline' ? 'An outline' : 'A line'} keeps at least ${min} points.` };
		return { patch: { points: pts.filter((_, i) => i !== v) } };
	}
	const closed = m.kind === 'outline';
	let edge = -1;
	let bestD = tol;
	const count = closed ? pts.length : pts.length - 1;
	for (let i = 0; i < count; i++) {
		const d = distanceToSegment(p, pts[i]!, pts[(i + 1) % pts.length]!);
		if (d <= bestD) {
			edge = i;
			bestD = d;
		}
	}
	if (edge < 0) return null;
	if (pts.length >= MAX_VERTICES_PER_MARK) return { refused: `A mark has at most ${MAX_VERTICES_PER_MARK.toLocaleString('en-GB')} points.` };
	return { patch: { points: [...pts.slice(0, edge + 1), p, ...pts.slice(edge + 1)] } };
}
