import { z } from 'zod';
import {
	CLOSURE_TYPES,
	CONTAINER_MATERIALS,
	CONTAINER_SHAPES,
	HAZARD_FLAGS,
	PRESERVATIVE_KINDS,
	SEAL_TYPES,
} from './vocabulary.ts';

/**
 * A museum object number: the museum's own, so the format varies; letters, digits and the usual
 * separators (. / - : space), 1–40 characters, no leading or trailing space.
 */
export const ObjectNumberSchema = z
	.string()
	.trim()
	.min(1, 'Give the object number.')
	.max(40, 'An object number has at most 40 characters.')
	.regex(/^[A-Za-z0-9][A-Za-z0-9./:\- ]*$/, 'Use letters, digits and . / : - only.');

// Kept to 0.1 mm (the columns are DECIMAL(7,1) and must stay above 0): a smaller size would round to 0 mm.
const mm = z.number({ error: 'Enter a size in mm.' }).min(0.1, 'At least 0.1 mm: sizes are kept to a tenth of a millimetre.').max(5000, 'At most 5000 mm.');

export const HazardSchema = z.object({
	flag: z.enum(HAZARD_FLAGS),
	note: z.string().trim().max(500).default(''),
});

/**
 * Inner dimensions by container shape: width is the diameter of a cylinder, the major axis of an
 * oval and the width of a rectangular jar; depth is the oval's minor axis or the box's depth.
 */
export const SpecimenSchema = z
	.object({
		objectNumber: ObjectNumberSchema,
		title: z.string().trim().min(1, 'Give a title.').max(200),
		description: z.string().trim().max(5000).default(''),
		department: z.string().trim().max(120).default(''),
		storageLocationId: z.uuid().nullable().default(null),
		preservativeRecorded: z.string().trim().max(200).default(''),
		preservativeKind: z.enum(PRESERVATIVE_KINDS),
		containerShape: z.enum(CONTAINER_SHAPES),
		innerWidthMm: mm,
		innerDepthMm: mm.nullable().default(null),
		innerHeightMm: mm,
		/** The top of the specimen above the inner base, as the level is measured; forecasts need it. */
		specimenTopMm: mm.nullable().default(null),
		containerMaterial: z.enum(CONTAINER_MATERIALS),
		closureType: z.enum(CLOSURE_TYPES),
		sealType: z.enum(SEAL_TYPES),
		hazards: z.array(HazardSchema).max(HAZARD_FLAGS.length).default([]),
		nextCheckDue: z.iso.date().nullable().default(null),
	})
	.strict()
	.superRefine((s, ctx) => {
		if (s.containerShape === 'cylinder' && s.innerDepthMm !== null) {
			ctx.addIssue({ code: 'custom', path: ['innerDepthMm'], message: 'A cylinder has a diameter only.' });
		}
		if (s.containerShape !== 'cylinder' && s.innerDepthMm === null) {
			ctx.addIssue({ code: 'custom', path: ['innerDepthMm'], message: 'Give the second inner dimension.' });
		}
		if (s.containerShape === 'oval' && s.innerDepthMm !== null && s.innerDepthMm > s.innerWidthMm) {
			ctx.addIssue({ code: 'custom', path: ['innerDepthMm'], message: 'The minor axis cannot exceed the major axis.' });
		}
		if (s.specimenTopMm !== null && s.specimenTopMm > s.innerHeightMm) {
			ctx.addIssue({ code: 'custom', path: ['specimenTopMm'], message: 'The top of the specimen cannot be above the inner height.' });
		}
		const flags = s.hazards.map((h) => h.flag);
		if (new Set(flags).size !== flags.length) {
			ctx.addIssue({ code: 'custom', path: ['hazards'], message: 'Each hazard once.' });
		}
	});

export type SpecimenInput = z.input<typeof SpecimenSchema>;
export type Specimen = z.output<typeof SpecimenSchema>;
