import { z } from 'zod';
import { PointSchema } from '../marks/schema.ts';

/**
 * A saved comparison of two photographs of one specimen, as the API takes and gives it. The control
 * points are the registration's input; the transform maps AFTER-photo pixels to BEFORE-photo pixels
 * (full-resolution, upright: the mark layers' space). The result is recomputed by the server on every
 * save (analysis.ts), so what is stored is what the pair showed when it was saved.
 */
export const MODELS = ['perspective', 'affine', 'none'] as const;
export type RegistrationModel = (typeof MODELS)[number];
export const MODEL_LABEL: Record<RegistrationModel, string> = {
	perspective: 'Perspective (4 or more pairs)',
	affine: 'Affine (3 or more pairs)',
	none: 'Unaligned (as photographed)',
};
export const MIN_PAIRS: Record<RegistrationModel, number> = { perspective: 4, affine: 3, none: 0 };
export const MAX_PAIRS = 60;

export const ControlPairSchema = z
	.object({
		n: z.number().int().min(1).max(999),
		before: PointSchema,
		after: PointSchema,
	})
	.strict();
export type ControlPair = z.infer<typeof ControlPairSchema>;

const uuid = z.uuid({ message: 'Choose a photograph.' });

export const ComparisonInputSchema = z
	.object({
		beforePhotoId: uuid,
		afterPhotoId: uuid,
		model: z.enum(MODELS, { message: `The registration is one of: ${MODELS.join(', ')}.` }),
		controlPoints: z
			.array(ControlPairSchema)
			.max(MAX_PAIRS, `At most ${MAX_PAIRS} pairs of control points.`)
			.refine((ps) => new Set(ps.map((p) => p.n)).size === ps.length, 'Two control point pairs have the same number.'),
		note: z.string().trim().max(4000, 'A note is at most 4,000 characters.').default(''),
	})
	.strict()
	.refine((c) => c.beforePhotoId !== c.afterPhotoId, { message: 'Compare two different photographs.', path: ['afterPhotoId'] })
	.refine((c) => c.controlPoints.length >= MIN_PAIRS[c.model], {
		message: 'Place enough pairs of control points for this registration (4 for perspective, 3 for affine), or compare unaligned.',
		path: ['controlPoints'],
	});
export type ComparisonInput = z.infer<typeof ComparisonInputSchema>;

export const ComparisonUpdateSchema = z.object({ version: z.number().int().min(0).max(2_000_000_000), comparison: ComparisonInputSchema }).strict();
