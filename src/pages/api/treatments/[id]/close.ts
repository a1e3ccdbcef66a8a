import type { APIRoute } from 'astro';
import { z } from 'zod';
import { problem, readJson } from '../../../../lib/server/http.ts';
import { closeTreatment } from '../../../../lib/server/treatments/service.ts';
import { actorOf, answer } from '../../../../lib/server/treatments/route.ts';

/** Completes a treatment (every step finished or not needed, the after check linked) or abandons it with a reason. */
const Body = z.object({ version: z.number().int().min(0), how: z.enum(['complete', 'abandon']), reason: z.string().trim().max(2000).default('') }).strict();

export const POST: APIRoute = async ({ params, request, locals, clientAddress }) => {
	const id = z.uuid().safeParse(params.id);
	if (!id.success) return problem(404, 'No such treatment.');
	const body = await readJson(request, Body);
	if (!body.ok) return body.response;
	const { version, how, reason } = body.value;
	return answer(async () => ({ treatment: await closeTreatment(actorOf(locals, clientAddress), id.data, version, how, reason) }));
};
