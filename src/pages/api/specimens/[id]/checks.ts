import type { APIRoute } from 'astro';
import { z } from 'zod';
import { problem, readJson } from '../../../../lib/server/http.ts';
import { checksOfSpecimen, openCheck } from '../../../../lib/server/checks/service.ts';
import { actorOf, answer } from '../../../../lib/server/checks/route.ts';

/** A specimen's condition checks, newest first, and opening a new one. */
const Id = z.uuid();
const OpenBody = z.object({ corrects: z.uuid().optional() }).strict();

export const GET: APIRoute = async ({ params }) => {
	const id = Id.safeParse(params.id);
	if (!id.success) return problem(404, 'No such specimen.');
	return answer(async () => ({ checks: await checksOfSpecimen(id.data) }));
};

export const POST: APIRoute = async ({ params, request, locals, clientAddress }) => {
	const id = Id.safeParse(params.id);
	if (!id.success) return problem(404, 'No such specimen.');
	const body = await readJson(request, OpenBody);
	if (!body.ok) return body.response;
	return answer(async () => ({ check: await openCheck(actorOf(locals, clientAddress), id.data, body.value.corrects) }), 201);
};
