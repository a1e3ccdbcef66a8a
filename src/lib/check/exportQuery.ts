import { z } from 'zod';

/**
 * Which condition checks the CSV export holds: those of one specimen, those dated within a range of
 * days (both ends included), or both; nothing given means every check. Unknown parameters are
 * refused so that a mistyped filter never silently exports everything.
 */
export const CheckExportQuerySchema = z
	.object({
		specimen: z.uuid('The specimen must be a specimen id.').optional(),
		from: z.iso.date('Give the first day as YYYY-MM-DD.').optional(),
		to: z.iso.date('Give the last day as YYYY-MM-DD.').optional(),
	})
	.strict()
	.refine((q) => !q.from || !q.to || q.from <= q.to, { message: 'The first day comes after the last day.', path: ['to'] });
export type CheckExportQuery = z.output<typeof CheckExportQuerySchema>;

export function parseCheckExportQuery(params: URLSearchParams) {
	return CheckExportQuerySchema.safeParse(Object.fromEntries(params));
}

/** The export's address for a filter, as the islands link to it (treatments take the same filters). */
export function checkExportUrl(q: CheckExportQuery = {}, what: 'checks' | 'treatments' = 'checks'): string {
	const p = new URLSearchParams(Object.entries(q).filter((e): e is [string, string] => typeof e[1] === 'string' && e[1] !== ''));
	const s = p.toString();
	return `/api/${what}/export.csv${s ? `?${s}` : ''}`;
}
