import type { MarkLayer } from '../marks/schema.ts';
import { compareFluidColour, type FluidColour, type FluidColourChange } from '../colour/index.ts';
import { compareMarkLayers, type Comparison } from './changes.ts';
import { fluidLevelChange, fluidLevelChangeFromReadings, type LevelChange } from './fluid.ts';
import { fitAffine, fitHomography, residuals, type Matrix3, type Residuals } from './registration.ts';
import { MIN_PAIRS, type ControlPair, type RegistrationModel } from './schema.ts';

/**
 * Everything a comparison of two photographs shows, from what is known about them: the registration
 * fitted to the control points, the change between the mark layers seen through it, the fluid level
 * from the level lines and from the checks' readings, and the fluid colour when the server measured
 * it. The island runs this live as points are placed; the server runs it again on save, so the
 * stored summary is exactly what was on the screen.
 */
export interface ComparedPhoto {
	width: number;
	height: number;
	layer: MarkLayer;
	/** The check's date (YYYY-MM-DD), or the capture date when the photo has no check. */
	date: string;
	/** The fluid level recorded at that check, mm above the inner base. */
	levelMm: number | null;
}

export type Registration =
	| { model: 'none'; transform: null; residuals: null; problem: null; note: string }
	| { model: Exclude<RegistrationModel, 'none'>; transform: Matrix3; residuals: Residuals; problem: null; note: string | null }
	| { model: Exclude<RegistrationModel, 'none'>; transform: null; residuals: null; problem: string; note: null };

export const UNALIGNED_NOTE = 'Compared unaligned: without control points the photographs are taken to be framed alike, so a moved camera shows as change.';
const EXACT_NOTE = (n: number) => `With exactly ${n} pairs the fit passes through every point, so every error is 0: add another pair to check the points against each other.`;

/** The transform from AFTER-photo pixels to BEFORE-photo pixels, or why there is none. */
export function registerPair(model: RegistrationModel, pairs: readonly ControlPair[]): Registration {
	if (model === 'none') return { model, transform: null, residuals: null, problem: null, note: UNALIGNED_NOTE };
	const min = MIN_PAIRS[model];
	if (pairs.length < min) return { model, transform: null, residuals: null, problem: `Place at least ${min} pairs of control points for a ${model} fit (${pairs.length} placed).`, note: null };
	const point = pairs.map((p) => ({ from: p.after, to: p.before, n: p.n }));
	try {
		const transform = model === 'perspective' ? fitHomography(point) : fitAffine(point);
		return { model, transform, residuals: residuals(transform, point), problem: null, note: pairs.length === min ? EXACT_NOTE(min) : null };
	} catch (err) {
		if (err instanceof RangeError) return { model, transform: null, residuals: null, problem: err.message, note: null };
		throw err;
	}
}

export interface Analysis {
	registration: Registration;
	/** The change between the layers, in the before photograph's frame. */
	changes: Comparison;
	/** Whether the layers were compared through a fitted transform. */
	aligned: boolean;
	levelFromMarks: LevelChange;
	levelFromReadings: LevelChange;
	colour: { before: FluidColour | null; after: FluidColour | null; change: FluidColourChange | null; problem: string | null };
}

export function analysePair(
	before: ComparedPhoto,
	after: ComparedPhoto,
	model: RegistrationModel,
	pairs: readonly ControlPair[],
	colour: { before: FluidColour | { problem: string } | null; after: FluidColour | { problem: string } | null } = { before: null, after: null },
): Analysis {
	const registration = registerPair(model, pairs);
	const changes = compareMarkLayers(before.layer, after.layer, { transform: registration.transform });
	const b = colour.before && 'lab' in colour.before ? colour.before : null;
	const a = colour.after && 'lab' in colour.after ? colour.after : null;
	const why = [colour.before, colour.after].flatMap((c, i) => (c && 'problem' in c ? [`${i ? 'Later' : 'Earlier'} photograph: ${c.problem}`] : []));
	let change: FluidColourChange | null = null;
	if (b && a) change = compareFluidColour(b, a);
	return {
		registration,
		changes,
		aligned: registration.transform !== null,
		levelFromMarks: fluidLevelChange({ layer: before.layer, date: before.date }, { layer: after.layer, date: after.date }),
		levelFromReadings: fluidLevelChangeFromReadings({ levelMm: before.levelMm, date: before.date }, { levelMm: after.levelMm, date: after.date }),
		colour: { before: b, after: a, change, problem: why.length ? why.join(' ') : colour.before === null || colour.after === null ? 'Fluid colour not measured.' : null },
	};
}

/** What is stored with a saved comparison: the figures, not the marks themselves (those stay in their layers). */
export function summaryOf(a: Analysis) {
	return {
		registration: {
			model: a.registration.model,
			// Each pair's error after the fit, in the order of the control points, px of the earlier photograph.
			errorsPx: a.registration.residuals?.errors ?? [],
			rmsPx: a.registration.residuals?.rms ?? null,
			bad: a.registration.residuals?.bad.map((b) => b.n) ?? [],
			problem: a.registration.problem,
		},
		aligned: a.aligned,
		counts: a.changes.summary.counts,
		basis: a.changes.basis,
		thresholds: a.changes.thresholds,
		changes: a.changes.changes.map((c) => ({
			change: c.change,
			part: c.part,
			term: c.term,
			shape: c.shape,
			beforeMarkId: c.before?.id ?? null,
			afterMarkId: c.after?.id ?? null,
			areaMm2: c.areaMm2,
			areaPx2: c.areaPx2,
			lengthMm: c.lengthMm,
			lengthPx: c.lengthPx,
			relative: c.relative,
		})),
		levelFromMarks: a.levelFromMarks,
		levelFromReadings: a.levelFromReadings,
		colour: {
			before: a.colour.before && { lab: a.colour.before.lab, yellowness: a.colour.before.yellowness, reliable: a.colour.before.reliable, reasons: a.colour.before.reasons },
			after: a.colour.after && { lab: a.colour.after.lab, yellowness: a.colour.after.yellowness, reliable: a.colour.after.reliable, reasons: a.colour.after.reasons },
			change: a.colour.change,
			problem: a.colour.problem,
		},
	};
}
export type ComparisonSummary = ReturnType<typeof summaryOf>;
