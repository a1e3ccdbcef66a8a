import type { APIRoute } from 'astro';
import { problem, zodFields } from '../../../lib/server/http.ts';
import { parseCheckExportQuery } from '../../../lib/check/exportQuery.ts';
import { TREATMENT_EXPORT_COLUMNS, treatmentExportRows } from '../../../lib/server/treatments/csv.ts';
import { csvDownload } from '../../../lib/server/csvExport.ts';

/** Treatments as a CSV download: every treatment, or those of one specimen and/or planned within a range of days. */
export const GET: APIRoute = async ({ url }) => {
	const q = parseCheckExportQuery(url.searchParams);
	if (!q.success) return problem(400, 'Some filters are not acceptable.', zodFields(q.error));
	return csvDownload(TREATMENT_EXPORT_COLUMNS, await treatmentExportRows(q.data), 'treatments');
};
