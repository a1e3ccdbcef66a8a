import type { Point } from '../schema.ts';
import type { ToolMeta, ToolStateBase } from './effects.ts';
import type { ToolContext } from './events.ts';
import { defineTool, result } from './common.ts';
import type { Finish } from './placing.ts';

/**
 * Pin, and the Control point built on it: press to show the pin, move to place it exactly, release
 * to drop it. Pins are for damage too small to outline (a chip, a spot of mould).
 */
export interface PinState extends ToolStateBase {
	press: Point | null;
}

const initial = (): PinState => ({ press: null, preview: null, message: null });

export function pointTool(meta: ToolMeta, make: (at: Point, ctx: ToolContext) => Finish) {
	const shown = (at: Point, ctx: ToolContext): PinState => {
		const f = make(at, ctx);
		return 'mark' in f ? { press: at, preview: { kind: 'draft', mark: f.mark }, message: null } : { press: at, preview: null, message: f.message };
	};
	return defineTool<PinState>(
		meta,
		initial,
		(s, e, ctx) => {
			if (e.type === 'down' || (e.type === 'move' && s.press)) return result(shown(e.at, ctx));
			if (e.type !== 'up' || !s.press) return result(s);
			const f = make(e.at, ctx);
			return 'mark' in f ? result(initial(), [{ kind: 'commit', mark: f.mark }]) : result({ ...initial(), message: f.message });
		},
		{ dropOnEscape: true },
	);
}

export const pinTool = pointTool({ id: 'pin', label: 'Pin', key: 'p', hint: 'Click to pin damage too small to outline.' }, (at) => ({ mark: { kind: 'pin', at } }));
