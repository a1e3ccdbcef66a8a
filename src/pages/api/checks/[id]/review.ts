import type { APIRoute } from 'astro';
import { z } from 'zod';
import { problem, readJson } from '../../../../lib/server/http.ts';
import { ReviewSchema } from '../../../../lib/check/schema.ts';
import { reviewCheck } from '../../../../lib/server/checks/service.ts';
import { actorOf, answer } from '../../../../lib/server/checks/route.ts';

/** A reviewer approves a check, or returns it with a comment. */
export const POST: APIRoute = async ({ params, request, locals, clientAddress }) => {
	const id = z.uuid().safeParse(params.id);
	if (!id.success) return problem(404, 'No such condition check.');
	const body = await readJson(request, ReviewSchema);
	if (!body.ok) return body.response;
	return answer(async () => ({ check: await reviewCheck(actorOf(locals, clientAddress), id.data, body.value.decision, body.value.comment) }));
};
