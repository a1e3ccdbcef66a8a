import type { APIRoute } from 'astro';
import { z } from 'zod';
import { problem, readJson } from '../../../../lib/server/http.ts';
import { openTreatment, treatmentsOfSpecimen } from '../../../../lib/server/treatments/service.ts';
import { actorOf, answer } from '../../../../lib/server/treatments/route.ts';
import { OpenTreatmentSchema } from '../../../../lib/treatment/schema.ts';

/** A specimen's treatments, newest first, and planning a new one (it starts from the template plan). */
const Id = z.uuid();

export const GET: APIRoute = async ({ params }) => {
	const id = Id.safeParse(params.id);
	if (!id.success) return problem(404, 'No such specimen.');
	return answer(async () => ({ treatments: await treatmentsOfSpecimen(id.data) }));
};

export const POST: APIRoute = async ({ params, request, locals, clientAddress }) => {
	const id = Id.safeParse(params.id);
	if (!id.success) return problem(404, 'No such specimen.');
	const body = await readJson(request, OpenTreatmentSchema);
	if (!body.ok) return body.response;
	return answer(async () => ({ treatment: await openTreatment(actorOf(locals, clientAddress), id.data, body.value) }), 201);
};
