import { z } from 'zod';
import { GRADES, PRIORITIES } from '../check/vocabulary.ts';
import { ForecastSchema } from '../history/schema.ts';
import { HAZARD_FLAGS } from '../specimen/vocabulary.ts';

/**
 * The collection overview: its query (GET /api/overview?collection=&location=, as in the home page's
 * address) and its answer. "Collection" is the record's collection or department field.
 */
const optional = <T extends z.ZodType>(s: T) => z.preprocess((v) => (v === '' || v === null ? undefined : v), s.optional());

export const OverviewQuerySchema = z
	.object({
		collection: optional(z.string().trim().min(1).max(120, 'A collection name has at most 120 characters.')),
		location: optional(z.uuid('Unknown storage location.')),
	})
	.strict();
export type OverviewQuery = z.infer<typeof OverviewQuerySchema>;

/** How many jars of the fastest and nearest to exposure each list shows. */
export const LOSS_LIST_LENGTH = 10;

const LocationRef = z.object({ id: z.uuid(), code: z.string(), name: z.string() });

export const LossRowSchema = z.object({
	id: z.uuid(),
	objectNumber: z.string(),
	title: z.string(),
	location: z.string().nullable(),
	latestLevelMm: z.number(),
	latestOn: z.iso.date(),
	/** From the trend since the last top-up (negative: falling). */
	perYearMm: z.number().nullable(),
	perYearMl: z.number().nullable(),
	specimenTopMm: z.number().nullable(),
	forecast: ForecastSchema,
});
export type LossRow = z.infer<typeof LossRowSchema>;

export const InventoryRowSchema = z.object({
	location: LocationRef,
	/** Jars counted: flammable spirit and unknown fluids presumed flammable. */
	jars: z.number(),
	spiritMl: z.number(),
	presumedMl: z.number(),
	/** Of the jars counted, those with no level on record (counted full). */
	withoutLevel: z.number(),
	/** The share of the total in the chosen collection (null when no collection is chosen). */
	collectionMl: z.number().nullable(),
	limitL: z.number().nullable(),
	nearLimitPercent: z.number(),
	status: z.enum(['over', 'near', 'within', 'no-limit']),
	/** Total over limit (1 = at the limit); null without a limit. */
	share: z.number().nullable(),
});
export type InventoryRow = z.infer<typeof InventoryRowSchema>;

export const AtRiskRowSchema = z.object({
	id: z.uuid(),
	objectNumber: z.string(),
	title: z.string(),
	location: LocationRef,
	warmestC: z.number(),
	levelMm: z.number(),
	checkedOn: z.iso.date(),
	innerHeightMm: z.number(),
	fillTempC: z.number(),
	fillTempAssumed: z.boolean(),
	percentVol: z.number(),
	fluidBasis: z.enum(['measured', 'assumed', 'water']),
	safeLevelMm: z.number(),
	drawOffMm: z.number(),
	drawOffMl: z.number(),
	/** Cooler stores where the jar would be safe as filled (and within their flammable limit). */
	saferStores: z.array(LocationRef.extend({ tempMaxC: z.number() })),
});
export type AtRiskRow = z.infer<typeof AtRiskRowSchema>;

export const OverviewSchema = z.object({
	asOf: z.iso.date(),
	filters: z.object({ collection: z.string().nullable(), location: z.string().nullable() }),
	/** For the filter controls. */
	collections: z.array(z.string()),
	locations: z.array(LocationRef),
	specimens: z.number(),
	byGrade: z.array(z.object({ grade: z.enum([...GRADES, 'not-checked']), count: z.number() })),
	byPriority: z.array(z.object({ priority: z.enum([...PRIORITIES, 'not-set']), count: z.number() })),
	overdue: z.number(),
	/** Specimens with a check waiting for review. */
	inReview: z.number(),
	byHazard: z.array(z.object({ flag: z.enum(HAZARD_FLAGS), count: z.number() })),
	fluidLoss: z.object({
		byRate: z.array(LossRowSchema),
		byTimeLeft: z.array(LossRowSchema),
		/** Jars the lists were chosen from (with a falling level over at least three readings, or exposed). */
		considered: z.number(),
	}),
	inventory: z.array(InventoryRowSchema),
	airspace: z.object({
		rows: z.array(AtRiskRowSchema),
		/** More jars were at risk than the list shows. */
		truncated: z.boolean(),
		/** Locations without a warmest temperature, whose jars were not assessed. */
		locationsWithoutTemperature: z.number(),
	}),
});
export type Overview = z.infer<typeof OverviewSchema>;
