import { z } from 'zod';
import { GRADES, PARTS, PRIORITIES, REASONS } from './vocabulary.ts';

/**
 * What a condition check holds, as the form and the API exchange it. Fluid readings are checked
 * for type here and for range by the fluid computations (OIML R 22 validity), which explain it.
 */
const PartSchema = z
	.object({
		grade: z.enum(GRADES).nullable().default(null),
		terms: z.array(z.string().trim().min(1).max(60)).max(20).default([]),
		note: z.string().trim().max(2000).default(''),
	})
	.strict();

export const FluidReadingSchema = z
	.object({
		readingPercentVol: z.number().nullable().default(null),
		tempC: z.number().nullable().default(null),
		glass: z.enum(['soda-lime', 'borosilicate']).default('soda-lime'),
		formaldehyde: z.enum(['not-tested', 'negative', 'positive']).default('not-tested'),
		pH: z.number().min(0, 'pH is between 0 and 14.').max(14, 'pH is between 0 and 14.').nullable().default(null),
		levelMm: z.number().min(0, 'The level is 0 mm or more.').max(5000).nullable().default(null),
		method: z.string().trim().max(500).default(''),
	})
	.strict();
export type FluidReading = z.output<typeof FluidReadingSchema>;

export const CheckBodySchema = z
	.object({
		checkedOn: z.iso.date('Give the date of the check (YYYY-MM-DD).'),
		reason: z.enum(REASONS),
		parts: z.object(Object.fromEntries(PARTS.map((p) => [p, PartSchema.default({ grade: null, terms: [], note: '' })])) as unknown as Record<(typeof PARTS)[number], typeof PartSchema>).strict(),
		overallOverride: z.object({ grade: z.enum(GRADES), reason: z.string().trim().max(1000) }).strict().nullable().default(null),
		priority: z.enum(PRIORITIES).nullable().default(null),
		notes: z.string().trim().max(10_000).default(''),
		fluid: FluidReadingSchema.nullable().default(null),
	})
	.strict();
export type CheckBody = z.output<typeof CheckBodySchema>;
export type CheckBodyInput = z.input<typeof CheckBodySchema>;

export const ReviewSchema = z
	.object({
		decision: z.enum(['approve', 'return']),
		comment: z.string().trim().max(5000).default(''),
	})
	.strict()
	.refine((r) => r.decision === 'approve' || r.comment.length >= 5, { message: 'Say what needs changing when you return a check.', path: ['comment'] });
