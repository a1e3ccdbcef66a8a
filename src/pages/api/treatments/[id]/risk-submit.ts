import type { APIRoute } from 'astro';
import { z } from 'zod';
import { problem, readJson } from '../../../../lib/server/http.ts';
import { submitRisk } from '../../../../lib/server/treatments/service.ts';
import { actorOf, answer } from '../../../../lib/server/treatments/route.ts';
import { VersionOnlySchema } from '../../../../lib/treatment/schema.ts';

/** A conservator asks for sign-off of the risk assessment; the reviewers are mailed. */
export const POST: APIRoute = async ({ params, request, locals, clientAddress }) => {
	const id = z.uuid().safeParse(params.id);
	if (!id.success) return problem(404, 'No such treatment.');
	const body = await readJson(request, VersionOnlySchema);
	if (!body.ok) return body.response;
	return answer(async () => ({ treatment: await submitRisk(actorOf(locals, clientAddress), id.data, body.value.version) }));
};
