import { bounds, validOutline } from '../geometry.ts';
import { markPoints } from '../policy.ts';
import type { Mark, Point } from '../schema.ts';
import { toleranceOf, type ToolContext } from './events.ts';
import type { Effect, ToolStateBase } from './effects.ts';
import { clampDelta, defineTool, distance, rectBetween, result } from './common.ts';
import { altEdit, checkShape, handleAt, hitTest, moveHandle, patched, translate } from './shapes.ts';

/**
 * Select: pick marks and change their geometry. A click takes the mark under the pointer, Shift-click
 * adds or removes one, a drag on empty photo draws a band round several. Dragging a selected mark
 * moves the whole selection; dragging a handle of a single selected mark moves that vertex. Alt-click
 * inserts a vertex on an edge or removes one. Delete removes, the arrow keys nudge. Every change is
 * one effect per mark at the END of its gesture, so a drag is one undo step however many moves it had.
 */
export type SelectGesture =
	/** Pressed on a mark: a click (select, toggle, Alt edit) or a drag that moves the selection. */
	| { kind: 'marks'; start: Point; at: Point; dragging: boolean; shift: boolean; alt: boolean; target: string; wasSelected: boolean }
	/** Pressed on a handle of the single selected mark. */
	| { kind: 'vertex'; start: Point; at: Point; dragging: boolean; shift: boolean; alt: boolean; id: string; index: number }
	/** Pressed on empty photo: a click clears, a drag draws a band. */
	| { kind: 'band'; start: Point; at: Point; dragging: boolean; shift: boolean };

export interface SelectState extends ToolStateBase {
	/** Ids of the selected marks, in the order they were picked. */
	selected: string[];
	/** The mark under the pointer while no button is down, for the cursor and a highlight. */
	hover: string | null;
	gesture: SelectGesture | null;
}

/** How far the arrow keys move the selection, photo px (with Shift, the larger step). */
export const NUDGE_PX = 1;
export const NUDGE_SHIFT_PX = 10;

const ARROWS = new Map<string, [number, number]>([
	['ArrowLeft', [-1, 0]],
	['ArrowRight', [1, 0]],
	['ArrowUp', [0, -1]],
	['ArrowDown', [0, 1]],
]);

const initial = (): SelectState => ({ selected: [], hover: null, gesture: null, preview: null, message: null });

const sameIds = (a: readonly string[], b: readonly string[]) => a.length === b.length && a.every((id, i) => id === b[i]);

/** The selection changed: say so, once. */
const selectIf = (before: readonly string[], after: string[]): Effect[] => (sameIds(before, after) ? [] : [{ kind: 'select', ids: after }]);

const lookup = (ctx: ToolContext) => new Map(ctx.marks.map((m) => [m.id, m]));

/** The marks to move, and the part of (dx, dy) that keeps all of them on the photo. */
function movement(ids: readonly string[], dx: number, dy: number, ctx: ToolContext) {
	const all = lookup(ctx);
	const marks = ids.flatMap((id) => all.get(id) ?? []);
	const [mx, my] = clampDelta(marks.flatMap((m) => markPoints(m)), dx, dy, ctx);
	return { marks, dx: mx, dy: my, moved: mx !== 0 || my !== 0 };
}

/**
 * One update per moved mark. Moving cannot change a shape, except that rounding of far-off
 * coordinates can make an outline whose vertex all but touches an edge touch it; apply.ts would
 * refuse that, so the move is refused here, with the reason, instead of failing there.
 */
function moveEffects(s: SelectState, marks: Mark[], dx: number, dy: number) {
	const moved = marks.map((m) => ({ m, patch: translate(m, dx, dy) }));
	for (const { m, patch } of moved) {
		const check = m.kind === 'outline' && patch.points ? validOutline(patch.points) : null;
		if (check && !check.ok) return result({ ...s, message: check.reason });
	}
	return result({ ...s, message: null }, moved.map(({ m, patch }): Effect => ({ kind: 'update', id: m.id, patch })));
}

function fullyInside(m: Mark, r: { x: number; y: number; w: number; h: number }): boolean {
	const b = bounds(markPoints(m));
	return b.x >= r.x && b.y >= r.y && b.x + b.w <= r.x + r.w && b.y + b.h <= r.y + r.h;
}

/** Alt-click on a mark's vertex or edge; null when the click was on neither (then it is a plain click). */
function altClick(s: SelectState, m: Mark | undefined, at: Point, tol: number) {
	if (!m) return null;
	const edit = altEdit(m, at, tol);
	if (!edit) return null;
	if ('refused' in edit) return result({ ...s, gesture: null, preview: null, message: edit.refused });
	const check = checkShape(patched(m, edit.patch), tol);
	if (!check.ok) return result({ ...s, gesture: null, preview: null, message: check.reason });
	const selected = [m.id];
	return result({ ...s, selected, gesture: null, preview: null }, [...selectIf(s.selected, selected), { kind: 'update', id: m.id, patch: edit.patch }]);
}

const meta = {
	id: 'select',
	label: 'Select',
	key: 's',
	hint: 'Click a mark to select it (Shift adds), drag to move; drag on the photo to select several. Alt-click adds or removes a point.',
} as const;

export const selectTool = defineTool<SelectState>(meta, initial, (state, e, ctx) => {
	const tol = toleranceOf(e, ctx);
	const all = lookup(ctx);
	// Marks removed since the last event (undo, another edit) cannot stay selected.
	const live = state.selected.filter((id) => all.has(id));
	const s: SelectState = live.length === state.selected.length ? state : { ...state, selected: live };

	switch (e.type) {
		case 'down': {
			const base = { start: e.at, at: e.at, dragging: false, shift: !!e.shift } as const;
			const single = s.selected.length === 1 ? all.get(s.selected[0]!) : undefined;
			const index = single ? handleAt(single, e.at, tol) : -1;
			if (single && index >= 0) return result({ ...s, message: null, gesture: { kind: 'vertex', ...base, alt: !!e.alt, id: single.id, index } });
			const target = hitTest(ctx.marks, e.at, tol);
			if (!target) return result({ ...s, message: null, gesture: { kind: 'band', ...base } });
			const wasSelected = s.selected.includes(target);
			// Selected at once, so a press-and-drag on an unselected mark moves it without a click first.
			const selected = wasSelected ? s.selected : e.shift ? [...s.selected, target] : [target];
			return result({ ...s, selected, message: null, gesture: { kind: 'marks', ...base, alt: !!e.alt, target, wasSelected } }, selectIf(s.selected, selected));
		}

		case 'move': {
			const g = s.gesture;
			if (!g) {
				const hover = hitTest(ctx.marks, e.at, tol);
				return result(hover === s.hover ? s : { ...s, hover });
			}
			const gesture = { ...g, at: e.at, dragging: g.dragging || distance(g.start, e.at) > tol };
			if (!gesture.dragging) return result({ ...s, gesture });
			if (gesture.kind === 'band') return result({ ...s, gesture, preview: { kind: 'band', ...rectBetween(gesture.start, e.at, false, ctx) } });
			if (gesture.kind === 'vertex') {
				const m = all.get(gesture.id);
				return result({ ...s, gesture, preview: m ? { kind: 'marks', marks: [patched(m, moveHandle(m, gesture.index, e.at, ctx))] } : null });
			}
			const mv = movement(s.selected, e.at[0] - gesture.start[0], e.at[1] - gesture.start[1], ctx);
			return result({ ...s, gesture, preview: { kind: 'marks', marks: mv.marks.map((m) => patched(m, translate(m, mv.dx, mv.dy))) } });
		}

		case 'up': {
			const g = s.gesture;
			if (!g) return result(s);
			const dragging = g.dragging || distance(g.start, e.at) > tol;
			const done: SelectState = { ...s, gesture: null, preview: null };

			if (g.kind === 'band') {
				if (!dragging) {
					const selected = g.shift ? s.selected : [];
					return result({ ...done, selected }, selectIf(s.selected, selected));
				}
				const band = rectBetween(g.start, e.at, false, ctx);
				const inBand = ctx.marks.filter((m) => fullyInside(m, band)).map((m) => m.id);
				const selected = g.shift ? [...s.selected, ...inBand.filter((id) => !s.selected.includes(id))] : inBand;
				return result({ ...done, selected }, selectIf(s.selected, selected));
			}

			if (g.kind === 'vertex') {
				const m = all.get(g.id);
				if (!m) return result(done);
				if (dragging) {
					const patch = moveHandle(m, g.index, e.at, ctx);
					const check = checkShape(patched(m, patch), tol);
					if (!check.ok) return result({ ...done, message: check.reason });
					return result(done, [{ kind: 'update', id: m.id, patch }]);
				}
				if (g.alt) return altClick(done, m, g.start, tol) ?? result(done);
				if (g.shift) return result({ ...done, selected: [] }, selectIf(s.selected, []));
				return result(done);
			}

			if (dragging) {
				const mv = movement(s.selected, e.at[0] - g.start[0], e.at[1] - g.start[1], ctx);
				return mv.moved ? moveEffects(done, mv.marks, mv.dx, mv.dy) : result(done);
			}
			if (g.alt) {
				const edited = altClick(done, all.get(g.target), g.start, tol);
				if (edited) return edited;
			}
			// A click: Shift takes an already selected mark out; a plain click narrows the selection to it.
			const selected = g.shift ? (g.wasSelected ? s.selected.filter((id) => id !== g.target) : s.selected) : [g.target];
			return result({ ...done, selected }, selectIf(s.selected, selected));
		}

		case 'key': {
			if (e.key === 'Escape') {
				if (s.gesture) return result({ ...s, gesture: null, preview: null });
				return result({ ...s, selected: [], message: null }, selectIf(s.selected, []));
			}
			if (s.gesture || s.selected.length === 0) return result(s);
			if (e.key === 'Delete' || e.key === 'Backspace') {
				return result({ ...s, selected: [], message: null }, [{ kind: 'delete', ids: s.selected }, { kind: 'select', ids: [] }]);
			}
			const dir = ARROWS.get(e.key);
			if (dir) {
				const step = e.shift ? NUDGE_SHIFT_PX : NUDGE_PX;
				const mv = movement(s.selected, dir[0] * step, dir[1] * step, ctx);
				return mv.moved ? moveEffects(s, mv.marks, mv.dx, mv.dy) : result(s);
			}
			return result(s);
		}

		case 'cancel':
			return result({ ...s, gesture: null, preview: null });
	}
});
