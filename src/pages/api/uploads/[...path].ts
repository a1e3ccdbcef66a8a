import type { APIRoute } from 'astro';
import { handleTus } from '../../../lib/server/photos/tus.ts';
import { markCancelled } from '../../../lib/server/photos/uploads.ts';

/**
 * The tus endpoint: POST creates, HEAD reports the offset, PATCH appends bytes, DELETE cancels an
 * unfinished upload. The middleware has checked the role and the Origin; tus ties each request to
 * its upload's owner. There is no GET: nothing is read back through tus (photos are served,
 * checked, from /api/photos).
 */
const tus: APIRoute = async ({ request, locals, params }) => {
	const response = await handleTus(request, locals.user!);
	if (request.method === 'DELETE' && response.status === 204 && params.path) await markCancelled(params.path, locals.user!);
	return response;
};

export const HEAD = tus;
export const POST = tus;
export const PATCH = tus;
export const DELETE = tus;
