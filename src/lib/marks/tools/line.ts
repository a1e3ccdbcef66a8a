import { MAX_VERTICES_PER_MARK } from '../schema.ts';
import { placingTool } from './placing.ts';

/**
 * Line: an open line for damage that has length but no area: a crack in the glass, a snapped or
 * slack mounting thread. Click point by point and double-click or press Enter to finish, or drag
 * once for a single straight segment.
 */
export const lineTool = placingTool({
	id: 'line',
	label: 'Line',
	key: 'l',
	hint: 'Click along the crack or thread; double-click or press Enter to finish. Drag for one straight segment.',
	min: 2,
	tooFew: (n) => `A line needs at least 2 points; it has ${n}.`,
	max: MAX_VERTICES_PER_MARK,
	closes: false,
	dragDraws: true,
	finish: (points) => ({ mark: { kind: 'path', points } }),
});
