import type { APIRoute } from 'astro';
import { z } from 'zod';
import { json, problem } from '../../../../lib/server/http.ts';
import { recordHistory } from '../../../../lib/server/specimens/history.ts';
import { getCheck } from '../../../../lib/server/checks/service.ts';

/** A check's trail: opened, saved, submitted, returned, approved — by whom and when. */
export const GET: APIRoute = async ({ params }) => {
	const id = z.uuid().safeParse(params.id);
	if (!id.success || !(await getCheck(id.data))) return problem(404, 'No such condition check.');
	return json({ history: await recordHistory('check', id.data) });
};
