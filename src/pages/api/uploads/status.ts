import type { APIRoute } from 'astro';
import { z } from 'zod';
import { json, problem } from '../../../lib/server/http.ts';
import { uploadStatuses } from '../../../lib/server/photos/uploads.ts';
import { SAFE_ID } from '../../../lib/server/photos/storage.ts';

/** Where the caller's uploads are: waiting, being checked, recorded, or refused and why. */
const Ids = z.array(z.string().regex(SAFE_ID, 'An upload id is 16–64 lowercase hexadecimal digits.')).min(1).max(500);

export const GET: APIRoute = async ({ url, locals }) => {
	const ids = Ids.safeParse(url.searchParams.getAll('id'));
	if (!ids.success) return problem(400, ids.error.issues[0]?.message ?? 'Name the uploads.');
	return json({ uploads: await uploadStatuses(locals.user!, ids.data) });
};
