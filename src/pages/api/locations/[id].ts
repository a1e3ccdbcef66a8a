import type { APIRoute } from 'astro';
import { z } from 'zod';
import { json, problem, readJson } from '../../../lib/server/http.ts';
import { updateLimits } from '../../../lib/server/locations/service.ts';
import { LocationLimitsPatchSchema } from '../../../lib/locations/schema.ts';

/** The administrator sets a store's flammable limit and temperature range. */
export const PATCH: APIRoute = async ({ params, request, locals, clientAddress }) => {
	const id = z.uuid().safeParse(params.id);
	if (!id.success) return problem(404, 'No such storage location.');
	const body = await readJson(request, LocationLimitsPatchSchema);
	if (!body.ok) return body.response;
	const r = await updateLimits(id.data, body.value, { id: locals.user!.id, clientAddress });
	return r.ok ? json({ location: r.location }) : problem(r.status, r.message, r.fields);
};
