import type { Part } from '../../check/vocabulary.ts';
import type { Level, Mark, Point, Severity } from '../schema.ts';
import type { ToolContext, ToolEvent } from './events.ts';

/**
 * What the tools say should happen, as data. A tool never changes the layer itself: it returns
 * effects, the island runs them through applyEffects (apply.ts) and records one history entry per
 * gesture. This keeps the tools replayable from events alone.
 */

/**
 * A new mark's geometry and kind, as drawn. The island adds what drawing cannot know: id, author,
 * times, and for damage marks part, term, severity and note; for a scale bar its length in mm; for
 * a level, which level, when the tool was not told (ToolContext.level).
 */
export type DraftMark =
	| { kind: 'outline'; points: Point[] }
	| { kind: 'path'; points: Point[] }
	| { kind: 'pin'; at: Point }
	| { kind: 'box'; x: number; y: number; w: number; h: number }
	| { kind: 'scale'; from: Point; to: Point }
	| { kind: 'grey'; x: number; y: number; w: number; h: number }
	| { kind: 'level'; from: Point; to: Point; level?: Level }
	| { kind: 'control'; at: Point; n: number };

/** The geometry fields a tool changes on an existing mark; which apply depends on its kind. */
export interface GeometryPatch {
	points?: Point[];
	at?: Point;
	from?: Point;
	to?: Point;
	x?: number;
	y?: number;
	w?: number;
	h?: number;
}

/**
 * A change to an existing mark. Tools only patch geometry; the island's properties panel patches
 * the rest through the same path, so those edits are undone the same way.
 */
export interface MarkPatch extends GeometryPatch {
	part?: Part;
	term?: string;
	severity?: Severity;
	note?: string;
	level?: Level;
	lengthMm?: number;
}

export type Effect =
	| { kind: 'commit'; mark: DraftMark }
	| { kind: 'update'; id: string; patch: MarkPatch }
	| { kind: 'delete'; ids: string[] }
	/** The selection changed (the island shows its properties); changes nothing in the layer. */
	| { kind: 'select'; ids: string[] };

/** What the island draws over the photo while a gesture is under way. */
export type Preview =
	/** Placed points so far; `rubber` is the loose end following the pointer; `closes` when the next click would close an outline. */
	| { kind: 'polyline'; points: Point[]; rubber: Point | null; closed: boolean; closes: boolean }
	/** The mark as it would be committed now (box, pin, two-point line). */
	| { kind: 'draft'; mark: DraftMark }
	/** The rubber band of a selection drag. */
	| { kind: 'band'; x: number; y: number; w: number; h: number }
	/** Existing marks as they will be after the gesture (moved, or with a vertex dragged): draw these instead. */
	| { kind: 'marks'; marks: Mark[] };

/** Every tool's state has these two; the rest is its own. */
export interface ToolStateBase {
	preview: Preview | null;
	/** Why the last action was refused, in a sentence for the person drawing; null when all is well. */
	message: string | null;
}

export interface ToolResult<S extends ToolStateBase> {
	state: S;
	effects: Effect[];
}

export const TOOL_IDS = ['select', 'outline', 'trace', 'line', 'pin', 'box', 'scale', 'grey', 'level', 'control'] as const;
export type ToolId = (typeof TOOL_IDS)[number];

export interface ToolMeta {
	id: ToolId;
	/** The name in the toolbar and the help panel. */
	label: string;
	/** The key that picks the tool (KeyboardEvent.key, lower case, no modifier). */
	key: string;
	/** One line for the tooltip: how to use it. */
	hint: string;
}

export interface Tool<S extends ToolStateBase> extends ToolMeta {
	initial(): S;
	// Method syntax on purpose: it lets every Tool<S> sit in one registry of Tool<ToolStateBase>.
	reduce(state: S, event: ToolEvent, ctx: ToolContext): ToolResult<S>;
}
