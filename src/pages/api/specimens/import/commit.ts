import type { APIRoute } from 'astro';
import { json, problem, readJson } from '../../../../lib/server/http.ts';
import { CommitBodySchema, MAX_IMPORT_BODY_BYTES } from '../../../../lib/specimen/csvImport.ts';
import { commitImport, ImportError } from '../../../../lib/server/specimens/importer.ts';

/**
 * Imports a CSV file: every row or none. When any row has an error, nothing is written and the
 * answer is 422 with the preview, so the page can show which rows to fix.
 */
export const POST: APIRoute = async ({ request, locals, clientAddress }) => {
	const body = await readJson(request, CommitBodySchema, MAX_IMPORT_BODY_BYTES);
	if (!body.ok) return body.response;
	try {
		const outcome = await commitImport({ id: locals.user!.id, clientAddress }, body.value.csv, body.value.mapping);
		if (outcome.ok) return json({ result: outcome.result });
		const n = outcome.preview.counts.error;
		return json({ error: `${n} ${n === 1 ? 'row has' : 'rows have'} errors, so nothing was imported.`, fields: [], preview: outcome.preview }, 422);
	} catch (err) {
		if (err instanceof ImportError) return problem(err.status, err.message);
		throw err;
	}
};
