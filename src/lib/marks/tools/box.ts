import type { Point } from '../schema.ts';
import { toleranceOf } from './events.ts';
import type { DraftMark, ToolMeta, ToolStateBase } from './effects.ts';
import { defineTool, rectBetween, result } from './common.ts';

/**
 * Box, and the Grey card built on it: drag a rectangle from corner to corner, in any direction;
 * Shift makes it square. A drag smaller than the tolerance either way is a slip, not a box.
 */
export interface BoxState extends ToolStateBase {
	anchor: Point | null;
}

export type Rect = { x: number; y: number; w: number; h: number };

const initial = (): BoxState => ({ anchor: null, preview: null, message: null });

export function rectTool(meta: ToolMeta, make: (rect: Rect) => DraftMark) {
	return defineTool<BoxState>(
		meta,
		initial,
		(s, e, ctx) => {
			if (e.type === 'down') return result({ anchor: e.at, preview: null, message: null });
			if ((e.type !== 'move' && e.type !== 'up') || !s.anchor) return result(s);
			const rect = rectBetween(s.anchor, e.at, !!e.shift, ctx);
			const tol = toleranceOf(e, ctx);
			const big = rect.w >= tol && rect.h >= tol;
			if (e.type === 'move') return result({ ...s, preview: big ? { kind: 'draft', mark: make(rect) } : null });
			return result(initial(), big ? [{ kind: 'commit', mark: make(rect) }] : []);
		},
		{ dropOnEscape: true },
	);
}

export const boxTool = rectTool({ id: 'box', label: 'Box', key: 'b', hint: 'Drag a rectangle over the damage; hold Shift for a square.' }, (r) => ({ kind: 'box', ...r }));
