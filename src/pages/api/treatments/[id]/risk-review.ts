import type { APIRoute } from 'astro';
import { z } from 'zod';
import { problem, readJson } from '../../../../lib/server/http.ts';
import { reviewRisk } from '../../../../lib/server/treatments/service.ts';
import { actorOf, answer } from '../../../../lib/server/treatments/route.ts';
import { RiskReviewSchema } from '../../../../lib/treatment/schema.ts';

/** A reviewer (not the author) signs off the risk assessment, or returns it with a comment. */
export const POST: APIRoute = async ({ params, request, locals, clientAddress }) => {
	const id = z.uuid().safeParse(params.id);
	if (!id.success) return problem(404, 'No such treatment.');
	const body = await readJson(request, RiskReviewSchema);
	if (!body.ok) return body.response;
	return answer(async () => ({ treatment: await reviewRisk(actorOf(locals, clientAddress), id.data, body.value.decision, body.value.comment) }));
};
