import type { APIRoute } from 'astro';
import { z } from 'zod';
import { json, problem } from '../../../../lib/server/http.ts';
import { recordHistory } from '../../../../lib/server/specimens/history.ts';
import { getSpecimen } from '../../../../lib/server/specimens/service.ts';

/** A specimen record's audit trail: who changed what, when, from what to what. */
export const GET: APIRoute = async ({ params }) => {
	const id = z.uuid().safeParse(params.id);
	if (!id.success || !(await getSpecimen(id.data))) return problem(404, 'No such specimen.');
	return json({ history: await recordHistory('specimen', id.data) });
};
