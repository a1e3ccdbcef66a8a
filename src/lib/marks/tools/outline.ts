import { validOutline } from '../geometry.ts';
import { MAX_VERTICES_PER_MARK } from '../schema.ts';
import { placingTool } from './placing.ts';

/**
 * Outline: a polygon around an area of damage (a patch of mould, a crazed zone of acrylic), placed
 * click by click. It closes on a click on the first point, a double-click or Enter; a shape that
 * crosses itself is refused with the reason and the points are kept, so one can be taken back.
 */
export const outlineTool = placingTool({
	id: 'outline',
	label: 'Outline',
	key: 'o',
	hint: 'Click around the damage; click the first point, double-click or press Enter to close. Backspace takes back a point.',
	min: 3,
	tooFew: (n) => `An outline needs at least 3 points; it has ${n}.`,
	max: MAX_VERTICES_PER_MARK,
	closes: true,
	dragDraws: false,
	finish(points) {
		const check = validOutline(points);
		return check.ok ? { mark: { kind: 'outline', points } } : { message: check.reason };
	},
});
