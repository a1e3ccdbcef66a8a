import type { APIRoute } from 'astro';
import { z } from 'zod';
import { problem, readJson } from '../../../../lib/server/http.ts';
import { submitCheck } from '../../../../lib/server/checks/service.ts';
import { actorOf, answer } from '../../../../lib/server/checks/route.ts';

/** Submits a draft for review. */
export const POST: APIRoute = async ({ params, request, locals, clientAddress }) => {
	const id = z.uuid().safeParse(params.id);
	if (!id.success) return problem(404, 'No such condition check.');
	const body = await readJson(request, z.object({ version: z.number().int().min(0) }).strict());
	if (!body.ok) return body.response;
	return answer(async () => ({ check: await submitCheck(actorOf(locals, clientAddress), id.data, body.value.version) }));
};
