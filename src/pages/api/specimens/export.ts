import type { APIRoute } from 'astro';
import { problem, zodFields } from '../../../lib/server/http.ts';
import { parseRegisterQuery } from '../../../lib/specimen/query.ts';
import { registerAll } from '../../../lib/server/specimens/register.ts';
import { EXPORT_COLUMNS, exportRow } from '../../../lib/server/specimens/csv.ts';
import { csvDownload } from '../../../lib/server/csvExport.ts';

/** The current filtered view of the register as a CSV download (every page, not just one). */
export const GET: APIRoute = async ({ url }) => {
	const q = parseRegisterQuery(url.searchParams);
	if (!q.success) return problem(400, 'Some filters are not acceptable.', zodFields(q.error));
	const rows: string[][] = [];
	for await (const s of registerAll(q.data)) rows.push(exportRow(s));
	return csvDownload(EXPORT_COLUMNS, rows, 'register');
};
