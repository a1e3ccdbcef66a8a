import type { APIRoute } from 'astro';
import { z } from 'zod';
import { problem, readJson } from '../../../lib/server/http.ts';
import { getTreatment, saveTreatment } from '../../../lib/server/treatments/service.ts';
import { actorOf, answer } from '../../../lib/server/treatments/route.ts';
import { SaveTreatmentSchema } from '../../../lib/treatment/schema.ts';

/** One treatment: read it, or save its plan and risk assessment (naming the version the edit started from). */
const Id = z.uuid();
/** A plan of 40 steps with their notes and materials is larger than a check: allow 512 KiB. */
const MAX_BYTES = 512 * 1024;

export const GET: APIRoute = async ({ params }) => {
	const id = Id.safeParse(params.id);
	const t = id.success ? await getTreatment(id.data) : null;
	return t ? answer(async () => ({ treatment: t })) : problem(404, 'No such treatment.');
};

export const PUT: APIRoute = async ({ params, request, locals, clientAddress }) => {
	const id = Id.safeParse(params.id);
	if (!id.success) return problem(404, 'No such treatment.');
	const body = await readJson(request, SaveTreatmentSchema, MAX_BYTES);
	if (!body.ok) return body.response;
	return answer(async () => ({ treatment: await saveTreatment(actorOf(locals, clientAddress), id.data, body.value.version, body.value.treatment) }));
};
