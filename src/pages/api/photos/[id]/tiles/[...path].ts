import path from 'node:path';
import fsp from 'node:fs/promises';
import type { APIRoute } from 'astro';
import { z } from 'zod';
import { json, problem } from '../../../../../lib/server/http.ts';
import { derivativeFile } from '../../../../../lib/server/photos/service.ts';
import { serveFile } from '../../../../../lib/server/photos/files.ts';
import { DERIVATIVE_CACHE } from '../../../../../lib/server/photos/derivativeRoute.ts';

/**
 * The IIIF Image API 3 level-0 service of a photograph: `info.json` (its id rewritten to this
 * address) and the pre-made tiles, `{region}/{size}/0/default.jpg`. Only paths of that exact shape
 * are looked up, inside the photo's current tile folder.
 */
const TILE = /^(full|\d{1,6},\d{1,6},\d{1,6},\d{1,6})\/(max|\d{1,6},\d{0,6}|\d{0,6},\d{1,6})\/0\/default\.jpg$/;

export const GET: APIRoute = async ({ params, request, url }) => {
	const id = z.uuid().safeParse(params.id);
	if (!id.success) return problem(404, 'No such photograph.');
	const rest = params.path ?? '';
	if (rest !== 'info.json' && !TILE.test(rest)) return problem(404, 'No such tile.');
	const found = await derivativeFile(id.data, 'tiles');
	if (!found) return problem(404, 'No such photograph.');
	const folder = path.dirname(found.file);
	const etag = `${found.derivative.setId}-${rest.replace(/[^0-9a-z]/gi, '.')}`;
	if (rest === 'info.json') {
		const info = JSON.parse(await fsp.readFile(found.file, 'utf8'));
		info.id = `${url.origin}/api/photos/${id.data}/tiles`;
		return json(info, 200, { 'content-type': 'application/ld+json;profile="http://iiif.io/api/image/3/context.json"', 'cache-control': DERIVATIVE_CACHE, etag: `"${etag}"` });
	}
	const response = await serveFile(request, path.join(folder, rest), { contentType: 'image/jpeg', etag, cacheControl: DERIVATIVE_CACHE });
	return response.status === 503 ? problem(404, 'No such tile.') : response;
};
