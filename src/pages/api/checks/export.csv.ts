import type { APIRoute } from 'astro';
import { problem, zodFields } from '../../../lib/server/http.ts';
import { parseCheckExportQuery } from '../../../lib/check/exportQuery.ts';
import { CHECK_EXPORT_COLUMNS, checkExportRows } from '../../../lib/server/checks/csv.ts';
import { csvDownload } from '../../../lib/server/csvExport.ts';

/** Condition checks as a CSV download: every check, or those of one specimen and/or a range of days. */
export const GET: APIRoute = async ({ url }) => {
	const q = parseCheckExportQuery(url.searchParams);
	if (!q.success) return problem(400, 'Some filters are not acceptable.', zodFields(q.error));
	return csvDownload(CHECK_EXPORT_COLUMNS, await checkExportRows(q.data), 'checks');
};
