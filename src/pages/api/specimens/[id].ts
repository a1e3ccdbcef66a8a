import type { APIRoute } from 'astro';
import { z } from 'zod';
import { json, problem, readJson } from '../../../lib/server/http.ts';
import { SpecimenSchema } from '../../../lib/specimen/schema.ts';
import { getSpecimen, SpecimenError, updateSpecimen } from '../../../lib/server/specimens/service.ts';

/** One specimen: read it, or replace its record (naming the version the edit was based on). */
const Id = z.uuid();
const UpdateBody = z.object({ version: z.number().int().min(0), record: SpecimenSchema }).strict();

export const GET: APIRoute = async ({ params }) => {
	const id = Id.safeParse(params.id);
	const specimen = id.success ? await getSpecimen(id.data) : null;
	return specimen ? json({ specimen }) : problem(404, 'No such specimen.');
};

export const PUT: APIRoute = async ({ params, request, locals, clientAddress }) => {
	const id = Id.safeParse(params.id);
	if (!id.success) return problem(404, 'No such specimen.');
	const body = await readJson(request, UpdateBody);
	if (!body.ok) return body.response;
	try {
		const specimen = await updateSpecimen({ id: locals.user!.id, clientAddress }, id.data, body.value.version, body.value.record);
		return json({ specimen });
	} catch (err) {
		if (err instanceof SpecimenError) return json({ error: err.message, fields: [], current: err.current ?? null }, err.status);
		throw err;
	}
};
