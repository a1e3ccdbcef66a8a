import type { APIRoute } from 'astro';
import { z } from 'zod';
import { problem } from '../http.ts';
import { derivativeFile } from './service.ts';
import { serveFile } from './files.ts';

/**
 * A derivative image route (thumbnail or display copy). The address stays the same if the set is
 * ever remade, so browsers keep a copy for an hour and then revalidate by ETag (the set id).
 */
export const DERIVATIVE_CACHE = 'private, max-age=3600';

export function derivativeRoute(kind: 'thumbnail' | 'display'): APIRoute {
	return async ({ params, request }) => {
		const id = z.uuid().safeParse(params.id);
		if (!id.success) return problem(404, 'No such photograph.');
		const found = await derivativeFile(id.data, kind);
		if (!found) return problem(404, 'No such photograph.');
		return serveFile(request, found.file, { contentType: found.derivative.mediaType, etag: `${found.derivative.setId}-${kind}`, cacheControl: DERIVATIVE_CACHE });
	};
}
