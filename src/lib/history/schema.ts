import { z } from 'zod';
import { CHECK_STATES, GRADES, PARTS, PRIORITIES, REASONS } from '../check/vocabulary.ts';

/**
 * What GET /api/specimens/[id]/timeline answers: every check of one specimen (oldest first) with its
 * grades and fluid readings, and the series drawn as charts (fluid level, real strength, fluid
 * yellowness), each with its trend. The island reads this type; the server parses its answer with it.
 */
const date = z.iso.date();

export const DatedValueSchema = z.object({ date, value: z.number() });

/** The trend of a series, as src/lib/fluid/trend.ts gives it. */
export const TrendViewSchema = z.discriminatedUnion('kind', [
	z.object({ kind: z.literal('too-few-points'), n: z.number(), message: z.string() }),
	z.object({ kind: z.literal('no-time-span'), n: z.number(), message: z.string() }),
	z.object({
		kind: z.enum(['trend', 'no-clear-trend']),
		n: z.number(),
		perYear: z.number(),
		perYearStdError: z.number(),
		r2: z.number(),
		latestFitted: z.number(),
		message: z.string(),
	}),
]);
export type TrendView = z.infer<typeof TrendViewSchema>;

/** When a falling series would reach its line (src/lib/history/outlook.ts). */
export const ForecastSchema = z.discriminatedUnion('kind', [
	z.object({ kind: z.enum(['no-line', 'at-or-below', 'no-trend', 'not-falling']), message: z.string() }),
	z.object({ kind: z.literal('date'), date, monthsFromToday: z.number(), message: z.string() }),
]);
export type ForecastView = z.infer<typeof ForecastSchema>;

export const SeriesPointSchema = z.object({
	date,
	value: z.number(),
	checkId: z.uuid(),
	/** From an approved check; only these are fitted (open checks are drawn, not trusted yet). */
	approved: z.boolean(),
	/** Fitted by the trend: approved and since the last top-up. */
	used: z.boolean(),
});

export const SeriesSchema = z.object({
	unit: z.string(),
	points: z.array(SeriesPointSchema),
	trend: TrendViewSchema,
	/** The least-squares line across the used points (null without one). */
	line: z.object({ from: DatedValueSchema, to: DatedValueSchema }).nullable(),
	/** Change per year as a volume, for the level only (mm/year × mL per mm). */
	mlPerYear: z.number().nullable(),
	/** The line the series must not fall to (the specimen's top; 65 % vol), null where there is none. */
	threshold: z.number().nullable(),
	/** When the fitted line reaches the threshold; null for a series that has no threshold. */
	forecast: ForecastSchema.nullable(),
});
export type Series = z.infer<typeof SeriesSchema>;

export const TimelineCheckSchema = z.object({
	id: z.uuid(),
	checkedOn: date,
	reason: z.enum(REASONS),
	state: z.enum(CHECK_STATES),
	overallGrade: z.enum(GRADES).nullable(),
	priority: z.enum(PRIORITIES).nullable(),
	parts: z.record(z.enum(PARTS), z.enum(GRADES).nullable()),
	examiner: z.string(),
	fluid: z
		.object({
			levelMm: z.number().nullable(),
			realPercentVol: z.number().nullable(),
			tempC: z.number().nullable(),
			pH: z.number().nullable(),
			formaldehyde: z.enum(['not-tested', 'negative', 'positive']),
		})
		.nullable(),
	/**
	 * The fluid's yellowness index (ASTM E313) measured on this check's photographs. The fluid colour
	 * module (src/lib/colour) is not wired in yet, so this is null for every check for now; when it
	 * is, the server fills it here and in `series.yellowness`, and the island draws it unchanged.
	 */
	yellowness: z.number().nullable(),
	/** A later approved check corrects this one: shown, but its readings are not fitted. */
	corrected: z.boolean(),
});
export type TimelineCheck = z.infer<typeof TimelineCheckSchema>;

export const TimelineSchema = z.object({
	specimen: z.object({
		id: z.uuid(),
		objectNumber: z.string(),
		title: z.string(),
		innerHeightMm: z.number(),
		specimenTopMm: z.number().nullable(),
		mlPerMm: z.number(),
	}),
	asOf: date,
	/** Oldest first. */
	checks: z.array(TimelineCheckSchema),
	/** The first date the trends use: the first reading after the jar was last topped up. */
	fillStartedOn: date.nullable(),
	series: z.object({
		level: SeriesSchema,
		strength: SeriesSchema,
		/** Empty until fluid colour is measured (see `yellowness` above). */
		yellowness: SeriesSchema,
	}),
});
export type Timeline = z.infer<typeof TimelineSchema>;
