import type { APIRoute } from 'astro';
import { json, problem, readJson } from '../../../../lib/server/http.ts';
import { MAX_IMPORT_BODY_BYTES, PreviewBodySchema } from '../../../../lib/specimen/csvImport.ts';
import { ImportError, previewImport } from '../../../../lib/server/specimens/importer.ts';

/** What importing a CSV file would do, row by row; changes nothing. Without a mapping, a guessed one is used. */
export const POST: APIRoute = async ({ request }) => {
	const body = await readJson(request, PreviewBodySchema, MAX_IMPORT_BODY_BYTES);
	if (!body.ok) return body.response;
	try {
		return json({ preview: await previewImport(body.value.csv, body.value.mapping) });
	} catch (err) {
		if (err instanceof ImportError) return problem(err.status, err.message);
		throw err;
	}
};
