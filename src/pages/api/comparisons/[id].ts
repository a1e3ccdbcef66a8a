import type { APIRoute } from 'astro';
import { z } from 'zod';
import { problem, readJson } from '../../../lib/server/http.ts';
import { ComparisonUpdateSchema } from '../../../lib/compare/schema.ts';
import { getComparison, updateComparison } from '../../../lib/server/compare/service.ts';
import { actorOf, answer } from '../../../lib/server/compare/route.ts';

/** One saved comparison: read it, or save it again naming the version it was loaded at (stale: 409 with `current`). */
const Id = z.uuid();

export const GET: APIRoute = async ({ params }) => {
	const id = Id.safeParse(params.id);
	if (!id.success) return problem(404, 'No such comparison.');
	return answer(async () => ({ comparison: await getComparison(id.data) }));
};

export const PUT: APIRoute = async ({ params, request, locals, clientAddress }) => {
	const id = Id.safeParse(params.id);
	if (!id.success) return problem(404, 'No such comparison.');
	const body = await readJson(request, ComparisonUpdateSchema);
	if (!body.ok) return body.response;
	const { version, comparison } = body.value;
	return answer(async () => ({ comparison: await updateComparison(actorOf(locals, clientAddress), id.data, version, comparison) }));
};
