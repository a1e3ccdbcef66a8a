import type { APIRoute } from 'astro';
import { z } from 'zod';
import { problem, readJson } from '../../../../lib/server/http.ts';
import { ComparisonInputSchema } from '../../../../lib/compare/schema.ts';
import { createComparison, listComparisons } from '../../../../lib/server/compare/service.ts';
import { actorOf, answer } from '../../../../lib/server/compare/route.ts';

/** A specimen's saved photo comparisons, newest first, and saving a new one (the server runs the analysis). */
const Id = z.uuid();

export const GET: APIRoute = async ({ params }) => {
	const id = Id.safeParse(params.id);
	if (!id.success) return problem(404, 'No such specimen.');
	return answer(async () => ({ comparisons: await listComparisons(id.data) }));
};

export const POST: APIRoute = async ({ params, request, locals, clientAddress }) => {
	const id = Id.safeParse(params.id);
	if (!id.success) return problem(404, 'No such specimen.');
	const body = await readJson(request, ComparisonInputSchema);
	if (!body.ok) return body.response;
	return answer(async () => ({ comparison: await createComparison(actorOf(locals, clientAddress), id.data, body.value) }), 201);
};
