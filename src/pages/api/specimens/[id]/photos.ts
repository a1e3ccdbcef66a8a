import type { APIRoute } from 'astro';
import { z } from 'zod';
import { json, problem } from '../../../../lib/server/http.ts';
import { photoList } from '../../../../lib/server/photos/service.ts';

/** Every photograph of a specimen, from any check or none, oldest capture first. */
export const GET: APIRoute = async ({ params, locals }) => {
	const id = z.uuid().safeParse(params.id);
	if (!id.success) return problem(404, 'No such specimen.');
	return json({ photos: await photoList({ specimenId: id.data }, locals.user!) });
};
