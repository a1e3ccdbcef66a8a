import type { Point } from '../schema.ts';
import { toleranceOf, type ToolContext } from './events.ts';
import type { DraftMark, Tool, ToolMeta, ToolStateBase } from './effects.ts';
import { defineTool, distance, near, result } from './common.ts';

/**
 * The click-by-click tools (Outline, Line, and the two-point Scale bar and Level) share one
 * machine: each click places a point, a double-click or Enter finishes, Backspace takes the last
 * point back, Escape drops the lot. What differs is how many points, whether clicking the first
 * point closes, whether a drag draws a straight segment, and what the finished mark is.
 */

/** Two releases this close in time (ms), within tolerance of each other, are a double-click. */
export const DOUBLE_CLICK_MS = 300;

export interface PlacingState extends ToolStateBase {
	points: Point[];
	/** The pointer is down; `dragged` once it has moved beyond the tolerance. */
	press: { at: Point; dragged: boolean } | null;
	hover: Point | null;
	lastUp: { at: Point; time: number } | null;
}

export type Finish = { mark: DraftMark } | { message: string };

export interface PlacingOptions extends ToolMeta {
	/** Fewest points for a mark, and the message when there are fewer. */
	min: number;
	tooFew: (n: number) => string;
	/** At this many points the tool finishes by itself (2 for a two-point line). */
	max: number;
	/** Clicking within tolerance of the first point finishes (a closed outline). */
	closes: boolean;
	/** A drag before any point is placed draws a straight segment from press to release. */
	dragDraws: boolean;
	finish(points: Point[], ctx: ToolContext): Finish;
}

const initial = (): PlacingState => ({ points: [], press: null, hover: null, lastUp: null, preview: null, message: null });

function withPreview(s: PlacingState, o: PlacingOptions, tolerance: number): PlacingState {
	const { points, hover, press } = s;
	if (press?.dragged && points.length === 0 && o.dragDraws) return { ...s, preview: { kind: 'polyline', points: [press.at], rubber: hover, closed: false, closes: false } };
	if (points.length === 0) return { ...s, preview: null };
	const closes = o.closes && points.length >= o.min && hover !== null && near(hover, points[0]!, tolerance);
	return { ...s, preview: { kind: 'polyline', points, rubber: closes ? points[0]! : hover, closed: false, closes } };
}

export function placingTool(o: PlacingOptions): Tool<PlacingState> {
	/** Finish if there are enough points and the shape is acceptable; otherwise keep the points and say why. */
	const tryFinish = (s: PlacingState, ctx: ToolContext, tol: number) => {
		const refuse = (message: string) => result(withPreview({ ...s, press: null, message }, o, tol));
		if (s.points.length < o.min) return refuse(o.tooFew(s.points.length));
		const f = o.finish(s.points, ctx);
		if ('message' in f) return refuse(f.message);
		return result(initial(), [{ kind: 'commit', mark: f.mark }]);
	};

	return defineTool<PlacingState>(o, initial, (s, e, ctx) => {
		const tol = toleranceOf(e, ctx);
		switch (e.type) {
			case 'down':
				return result(withPreview({ ...s, press: { at: e.at, dragged: false }, hover: e.at, message: null }, o, tol));
			case 'move': {
				const press = s.press && { at: s.press.at, dragged: s.press.dragged || distance(s.press.at, e.at) > tol };
				return result(withPreview({ ...s, press, hover: e.at }, o, tol));
			}
			case 'up': {
				if (!s.press) return result(s);
				const dragged = s.press.dragged || distance(s.press.at, e.at) > tol;
				const double = s.lastUp !== null && e.time - s.lastUp.time >= 0 && e.time - s.lastUp.time <= DOUBLE_CLICK_MS && near(s.lastUp.at, e.at, tol);
				const next: PlacingState = { ...s, press: null, hover: e.at, lastUp: { at: e.at, time: e.time } };
				// A drag that comes back to where it started draws nothing (a line of zero length is no line); it counts as a click.
				if (dragged && s.points.length === 0 && o.dragDraws && !near(s.press.at, e.at, tol)) return tryFinish({ ...next, points: [s.press.at, e.at] }, ctx, tol);
				// A click places the point where the button went down (the release wobbles); a drag, where it ended.
				const at = dragged ? e.at : s.press.at;
				if (!dragged && double && s.points.length >= o.min) return tryFinish(next, ctx, tol);
				if (o.closes && s.points.length > 1 && near(at, s.points[0]!, tol)) return tryFinish(next, ctx, tol);
				// A second click on the last point (or the second half of a double-click) adds nothing: no zero-length edges.
				const last = s.points[s.points.length - 1];
				if (last && near(at, last, tol)) return result(withPreview(next, o, tol));
				const placed = { ...next, points: [...s.points, at] };
				if (placed.points.length >= o.max) return tryFinish(placed, ctx, tol);
				return result(withPreview(placed, o, tol));
			}
			case 'key':
				if (e.key === 'Enter') return tryFinish(s, ctx, tol);
				if (e.key === 'Escape') return result(initial());
				if (e.key === 'Backspace' && s.points.length > 0) return result(withPreview({ ...s, points: s.points.slice(0, -1), lastUp: null, message: null }, o, tol));
				return result(s);
			case 'cancel':
				// The pointer gesture is lost, not the points already placed by earlier clicks.
				return result(withPreview({ ...s, press: null }, o, tol));
		}
	});
}
