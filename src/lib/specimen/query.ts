import { z } from 'zod';
import { CONTAINER_SHAPES, HAZARD_FLAGS, PRESERVATIVE_KINDS, SEAL_TYPES } from './vocabulary.ts';
import { GRADES, PRIORITIES } from '../check/vocabulary.ts';

/**
 * The register's view: search, filters, sort and page, as they appear in the URL so a view can be
 * shared. One schema for the island (reading the address bar) and the API (reading the request).
 */
export const SORT_KEYS = ['objectNumber', 'title', 'location', 'preservativeKind', 'sealType', 'currentGrade', 'currentPriority', 'nextCheckDue', 'updatedAt'] as const;
export type SortKey = (typeof SORT_KEYS)[number];

export const DUE_FILTERS = ['overdue', 'within-90-days', 'not-set'] as const;
/** Jars with a condition check in this state (the overview's "checks in review" opens this view). */
export const CHECK_FILTERS = ['in-review', 'draft', 'returned'] as const;

const optional = <T extends z.ZodType>(s: T) => z.preprocess((v) => (v === '' || v === null ? undefined : v), s.optional());

export const RegisterQuerySchema = z.object({
	q: optional(z.string().trim().max(100, 'Search for at most 100 characters.')),
	location: optional(z.uuid('Unknown storage location.')),
	/** The collection or department, exactly as recorded. */
	department: optional(z.string().trim().max(120, 'A department has at most 120 characters.')),
	preservative: optional(z.enum(PRESERVATIVE_KINDS)),
	seal: optional(z.enum(SEAL_TYPES)),
	shape: optional(z.enum(CONTAINER_SHAPES)),
	hazard: optional(z.enum(HAZARD_FLAGS)),
	due: optional(z.enum(DUE_FILTERS)),
	grade: optional(z.enum([...GRADES, 'not-checked'])),
	priority: optional(z.enum([...PRIORITIES, 'not-set'])),
	check: optional(z.enum(CHECK_FILTERS)),
	/** Jars a store's flammable total counts: flammable spirit, and unknown fluids presumed flammable. */
	flammable: optional(z.enum(['yes'])),
	sort: z.enum(SORT_KEYS).catch('objectNumber'),
	dir: z.enum(['asc', 'desc']).catch('asc'),
	page: z.coerce.number().int().min(1).max(100_000).catch(1),
	pageSize: z.coerce.number().int().min(10).max(200).catch(50),
});
export type RegisterQuery = z.infer<typeof RegisterQuerySchema>;

/** Reads a register view from URL search parameters; unknown sort/page values fall back to defaults. */
export function parseRegisterQuery(params: URLSearchParams) {
	return RegisterQuerySchema.safeParse(Object.fromEntries(params));
}

/** Writes a view back to search parameters, leaving defaults out so shared links stay short. */
export function registerQueryToParams(q: Partial<RegisterQuery>): URLSearchParams {
	const p = new URLSearchParams();
	const defaults: Partial<Record<keyof RegisterQuery, unknown>> = { sort: 'objectNumber', dir: 'asc', page: 1, pageSize: 50 };
	for (const [k, v] of Object.entries(q)) {
		if (v === undefined || v === '' || defaults[k as keyof RegisterQuery] === v) continue;
		p.set(k, String(v));
	}
	return p;
}
