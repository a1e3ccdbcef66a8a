import type { Mark } from '../schema.ts';
import { rectTool } from './box.ts';
import { pointTool } from './pin.ts';
import { placingTool } from './placing.ts';

/**
 * The measurement tools: geometry that lets photographs be measured and compared, not damage.
 * Each is a variant of a drawing tool; only the mark it makes differs.
 */

const twoPoint = {
	min: 2,
	tooFew: (n: number) => `Place both ends of the line; ${n} placed.`,
	max: 2,
	closes: false,
	dragDraws: true,
} as const;

/** Scale bar: a line along the ruler in the photo; the island then asks for its length in mm. */
export const scaleTool = placingTool({
	id: 'scale',
	label: 'Scale bar',
	key: 'm',
	hint: 'Drag (or click both ends) along the ruler in the photo, then give its length in mm.',
	...twoPoint,
	finish: ([from, to]) => ({ mark: { kind: 'scale', from: from!, to: to! } }),
});

/** Level: the fluid line, the specimen's top or the jar's inner base, as a line across the jar. */
export const levelTool = placingTool({
	id: 'level',
	label: 'Level',
	key: 'h',
	hint: 'Drag (or click both ends) across the jar at the fluid line, the top of the specimen or the inner base.',
	...twoPoint,
	finish: ([from, to], ctx) => ({ mark: ctx.level ? { kind: 'level', from: from!, to: to!, level: ctx.level } : { kind: 'level', from: from!, to: to! } }),
});

/** Grey card: a box on the grey reference, for white balance when photographs are compared. */
export const greyTool = rectTool({ id: 'grey', label: 'Grey card', key: 'g', hint: 'Drag a rectangle inside the grey card.' }, (r) => ({ kind: 'grey', ...r }));

/** The schema's largest control-point number. */
export const MAX_CONTROL_NUMBER = 999;

/**
 * The lowest number no control point of the layer uses. Gaps are filled: control points are matched
 * by number across photographs of the same jar, so a re-placed number 2 should be 2 again.
 */
export function nextControlNumber(marks: readonly Mark[]): number {
	return lowestUnused(marks.flatMap((m) => (m.kind === 'control' ? [m.n] : [])));
}

/** The lowest whole number from 1 up that `used` does not hold (control points and compare pairs number this way). */
export function lowestUnused(used: Iterable<number>): number {
	const taken = new Set(used);
	let n = 1;
	while (taken.has(n)) n++;
	return n;
}

/** Control point: a numbered pin on a feature visible in every photograph of the jar, for registering them. */
export const controlTool = pointTool(
	{ id: 'control', label: 'Control point', key: 'c', hint: 'Click a feature that shows in every photograph of this jar; points are numbered in turn.' },
	(at, ctx) => {
		const n = nextControlNumber(ctx.marks);
		if (n > MAX_CONTROL_NUMBER) return { message: `A photo has at most ${MAX_CONTROL_NUMBER} control points.` };
		return { mark: { kind: 'control', at, n } };
	},
);
