import type { APIRoute } from 'astro';
import { z } from 'zod';
import { json, problem } from '../../../lib/server/http.ts';
import { getPhoto, photoRecord } from '../../../lib/server/photos/service.ts';
import { lastFixity } from '../../../lib/server/photos/fixity.ts';

/** One recorded photograph: what it shows, its EXIF, its hash, who uploaded it, and where its files are. */
export const GET: APIRoute = async ({ params, locals }) => {
	const id = z.uuid().safeParse(params.id);
	if (!id.success) return problem(404, 'No such photograph.');
	const photo = await getPhoto(id.data);
	if (!photo) return problem(404, 'No such photograph.');
	return json({ photo: { ...photoRecord(photo, locals.user!), fixity: await lastFixity(photo.id) } });
};
