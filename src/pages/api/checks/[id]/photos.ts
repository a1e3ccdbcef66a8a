import type { APIRoute } from 'astro';
import { z } from 'zod';
import { json, problem } from '../../../../lib/server/http.ts';
import { photoList } from '../../../../lib/server/photos/service.ts';

/** The photographs taken for one condition check. */
export const GET: APIRoute = async ({ params, locals }) => {
	const id = z.uuid().safeParse(params.id);
	if (!id.success) return problem(404, 'No such condition check.');
	return json({ photos: await photoList({ checkId: id.data }, locals.user!) });
};
