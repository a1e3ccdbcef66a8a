import type { APIRoute } from 'astro';
import { json, problem, readJson, zodFields } from '../../../lib/server/http.ts';
import { parseRegisterQuery } from '../../../lib/specimen/query.ts';
import { SpecimenSchema } from '../../../lib/specimen/schema.ts';
import { registerPage } from '../../../lib/server/specimens/register.ts';
import { createSpecimen, SpecimenError } from '../../../lib/server/specimens/service.ts';

/** The register (one page of a filtered, sorted view) and registering a new specimen. */
export const GET: APIRoute = async ({ url }) => {
	const q = parseRegisterQuery(url.searchParams);
	if (!q.success) return problem(400, 'Some filters are not acceptable.', zodFields(q.error));
	return json(await registerPage(q.data));
};

export const POST: APIRoute = async ({ request, locals, clientAddress }) => {
	const body = await readJson(request, SpecimenSchema);
	if (!body.ok) return body.response;
	try {
		return json({ specimen: await createSpecimen({ id: locals.user!.id, clientAddress }, body.value) }, 201);
	} catch (err) {
		if (err instanceof SpecimenError) return problem(err.status, err.message);
		throw err;
	}
};
