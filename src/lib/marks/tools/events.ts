import type { Level, Mark, Point } from '../schema.ts';

/**
 * What the canvas island feeds the tools. Positions are already in PHOTO pixels (the island converts
 * with toPhoto), so a tool never knows the zoom, and a recorded sequence of events replays the same
 * at any view. `time` is the event's timestamp in ms (PointerEvent.timeStamp); only differences are
 * used, for double-clicks.
 */
export interface PointerInput {
	type: 'down' | 'move' | 'up';
	at: Point;
	shift?: boolean;
	alt?: boolean;
	time: number;
	/** Overrides the context's tolerance for this event (the zoom may change mid-gesture). */
	tolerancePx?: number;
}

/** A key press; `key` is KeyboardEvent.key ('Enter', 'Escape', 'Backspace', 'ArrowLeft', 'z', …). */
export interface KeyInput {
	type: 'key';
	key: string;
	shift?: boolean;
	ctrl?: boolean;
	meta?: boolean;
	alt?: boolean;
}

/** The gesture was taken away from us (pointercancel, focus lost, tool switched): drop it. */
export interface CancelInput {
	type: 'cancel';
}

export type ToolEvent = PointerInput | KeyInput | CancelInput;

/** What a tool may know about the world besides the event. */
export interface ToolContext {
	/**
	 * How near counts as "on" something, in PHOTO pixels: the island passes a constant screen
	 * distance divided by the view scale (e.g. 8 / scale), so snapping feels the same at every zoom.
	 */
	tolerancePx: number;
	/** The layer's marks, bottom first (the last one is drawn on top). */
	marks: readonly Mark[];
	/** The photo's size: points are kept on it, as the server refuses marks outside the photo. */
	photo?: { width: number; height: number };
	/** Which level the Level tool draws (the island's sub-choice); without it the island asks afterwards. */
	level?: Level;
}

/** Below this a tolerance is meaningless (and 0 would make every click a drag). */
const MIN_TOLERANCE = 1e-6;

/** The tolerance in force for this event: its own, else the context's; never zero, NaN or negative. */
export function toleranceOf(event: ToolEvent, ctx: ToolContext): number {
	const t = event.type === 'down' || event.type === 'move' || event.type === 'up' ? (event.tolerancePx ?? ctx.tolerancePx) : ctx.tolerancePx;
	return Number.isFinite(t) && t > MIN_TOLERANCE ? t : MIN_TOLERANCE;
}

export const isPointer = (event: ToolEvent): event is PointerInput => event.type === 'down' || event.type === 'move' || event.type === 'up';
