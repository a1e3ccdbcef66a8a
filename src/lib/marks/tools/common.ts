import { bounds } from '../geometry.ts';
import { MAX_COORDINATE, type Point } from '../schema.ts';
import { isPointer, type ToolContext } from './events.ts';
import type { Effect, Tool, ToolMeta, ToolResult, ToolStateBase } from './effects.ts';

/** Helpers the tools share; not part of the public API. */

export const distance = (a: Point, b: Point): number => Math.hypot(b[0] - a[0], b[1] - a[1]);
export const near = (a: Point, b: Point, tolerance: number): boolean => distance(a, b) <= tolerance;

/** Where points may be: on the photo when its size is known, else within the schema's limits. */
export function areaOf(ctx: ToolContext): { minX: number; minY: number; maxX: number; maxY: number } {
	const p = ctx.photo;
	if (p && Number.isFinite(p.width) && Number.isFinite(p.height) && p.width > 0 && p.height > 0) {
		return { minX: 0, minY: 0, maxX: Math.min(p.width, MAX_COORDINATE), maxY: Math.min(p.height, MAX_COORDINATE) };
	}
	return { minX: -MAX_COORDINATE, minY: -MAX_COORDINATE, maxX: MAX_COORDINATE, maxY: MAX_COORDINATE };
}

const clamp = (v: number, lo: number, hi: number): number => Math.min(hi, Math.max(lo, v));

export function clampPoint(p: Point, ctx: ToolContext): Point {
	const a = areaOf(ctx);
	return [clamp(p[0], a.minX, a.maxX), clamp(p[1], a.minY, a.maxY)];
}

/**
 * The largest part of (dx, dy) that keeps all the points in the area. Points already outside (an
 * older mark, a photo since cropped) may stay where they are but are not pushed further out.
 */
export function clampDelta(points: readonly Point[], dx: number, dy: number, ctx: ToolContext): [number, number] {
	if (points.length === 0) return [dx, dy];
	const a = areaOf(ctx);
	const b = bounds(points);
	const lo = (min: number, bound: number) => Math.min(0, bound - min);
	const hi = (max: number, bound: number) => Math.max(0, bound - max);
	return [clamp(dx, lo(b.x, a.minX), hi(b.x + b.w, a.maxX)), clamp(dy, lo(b.y, a.minY), hi(b.y + b.h, a.maxY))];
}

/** The schema caps a box's side; a box across the whole coordinate range would exceed it. */
const capSide = (v: number): number => Math.min(v, MAX_COORDINATE);

/**
 * The rectangle spanned by an anchor and the pointer, normalised so w, h ≥ 0. With `square` the
 * longer side wins, growing toward the pointer, and shrinks if it would leave the area.
 */
export function rectBetween(anchor: Point, pointer: Point, square: boolean, ctx: ToolContext): { x: number; y: number; w: number; h: number } {
	let dx = pointer[0] - anchor[0];
	let dy = pointer[1] - anchor[1];
	if (square) {
		const a = areaOf(ctx);
		const room = (d: number, at: number, min: number, max: number) => (d < 0 ? at - min : max - at);
		const side = Math.min(Math.max(Math.abs(dx), Math.abs(dy)), room(dx, anchor[0], a.minX, a.maxX), room(dy, anchor[1], a.minY, a.maxY));
		dx = (dx < 0 ? -1 : 1) * side;
		dy = (dy < 0 ? -1 : 1) * side;
	}
	return { x: Math.min(anchor[0], anchor[0] + dx), y: Math.min(anchor[1], anchor[1] + dy), w: capSide(Math.abs(dx)), h: capSide(Math.abs(dy)) };
}

export const result = <S extends ToolStateBase>(state: S, effects: Effect[] = []): ToolResult<S> => ({ state, effects });

/**
 * Makes a tool from its reducer. The reducer only ever sees pointer positions that are finite and
 * on the photo: an event with NaN or Infinity (a bad conversion at a zero scale) is ignored, not
 * drawn. With `dropOnEscape` (the one-gesture tools), Escape and a cancelled pointer start over.
 */
export function defineTool<S extends ToolStateBase>(meta: ToolMeta, initial: () => S, reduce: Tool<S>['reduce'], opts: { dropOnEscape?: boolean } = {}): Tool<S> {
	const { id, label, key, hint } = meta;
	return {
		id,
		label,
		key,
		hint,
		initial,
		reduce(state, event, ctx) {
			if (opts.dropOnEscape && (event.type === 'cancel' || (event.type === 'key' && event.key === 'Escape'))) return result(initial());
			if (!isPointer(event)) return reduce(state, event, ctx);
			const [x, y] = event.at;
			if (!Number.isFinite(x) || !Number.isFinite(y)) return result(state);
			return reduce(state, { ...event, at: clampPoint(event.at, ctx) }, ctx);
		},
	};
}
