import type { APIRoute } from 'astro';
import { z } from 'zod';
import { problem, readJson } from '../../../lib/server/http.ts';
import { CheckBodySchema } from '../../../lib/check/schema.ts';
import { getCheck, saveCheck } from '../../../lib/server/checks/service.ts';
import { actorOf, answer } from '../../../lib/server/checks/route.ts';

/** One condition check: read it, or save a draft (naming the version the edit started from). */
const Id = z.uuid();
const SaveBody = z.object({ version: z.number().int().min(0), check: CheckBodySchema }).strict();

export const GET: APIRoute = async ({ params }) => {
	const id = Id.safeParse(params.id);
	const check = id.success ? await getCheck(id.data) : null;
	return check ? answer(async () => ({ check })) : problem(404, 'No such condition check.');
};

export const PUT: APIRoute = async ({ params, request, locals, clientAddress }) => {
	const id = Id.safeParse(params.id);
	if (!id.success) return problem(404, 'No such condition check.');
	const body = await readJson(request, SaveBody);
	if (!body.ok) return body.response;
	return answer(async () => ({ check: await saveCheck(actorOf(locals, clientAddress), id.data, body.value.version, body.value.check) }));
};
