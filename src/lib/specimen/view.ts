import { z } from 'zod';
import { HazardSchema } from './schema.ts';
import { GRADES, PRIORITIES } from '../check/vocabulary.ts';
import { CLOSURE_TYPES, CONTAINER_MATERIALS, CONTAINER_SHAPES, PRESERVATIVE_KINDS, SEAL_TYPES } from './vocabulary.ts';

/** A specimen as the API shows it. */
export const SpecimenViewSchema = z.object({
	id: z.string(),
	objectNumber: z.string(),
	title: z.string(),
	description: z.string(),
	department: z.string(),
	storageLocation: z.object({ id: z.string(), code: z.string(), name: z.string() }).nullable(),
	preservativeRecorded: z.string(),
	preservativeKind: z.enum(PRESERVATIVE_KINDS),
	containerShape: z.enum(CONTAINER_SHAPES),
	innerWidthMm: z.number(),
	innerDepthMm: z.number().nullable(),
	innerHeightMm: z.number(),
	specimenTopMm: z.number().nullable(),
	containerMaterial: z.enum(CONTAINER_MATERIALS),
	closureType: z.enum(CLOSURE_TYPES),
	sealType: z.enum(SEAL_TYPES),
	hazards: z.array(HazardSchema),
	nextCheckDue: z.string().nullable(),
	currentGrade: z.enum(GRADES).nullable(),
	currentPriority: z.enum(PRIORITIES).nullable(),
	lastCheckedOn: z.string().nullable(),
	version: z.number(),
	createdAt: z.string(),
	updatedAt: z.string(),
});
export type SpecimenView = z.infer<typeof SpecimenViewSchema>;

export interface RegisterPage {
	rows: SpecimenView[];
	total: number;
	page: number;
	pageSize: number;
}

export interface HistoryEntry {
	id: number;
	at: string;
	action: string;
	actor: string | null;
	changes: { field: string; before: unknown; after: unknown }[];
}
