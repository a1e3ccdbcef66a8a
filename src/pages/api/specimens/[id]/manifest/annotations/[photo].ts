import type { APIRoute } from 'astro';
import { z } from 'zod';
import { json, problem } from '../../../../../../lib/server/http.ts';
import { manifestAnnotations } from '../../../../../../lib/server/iiif/manifest.ts';
import { MANIFEST_CONTENT_TYPE } from '../../../../../../lib/iiif/manifest.ts';

/** One canvas's marks (W3C Web Annotations with SVG selectors on the canvas), referenced by the manifest. */
export const GET: APIRoute = async ({ params, url }) => {
	const id = z.uuid().safeParse(params.id);
	const photoId = z.uuid().safeParse(params.photo);
	if (!id.success || !photoId.success) return problem(404, 'No such photograph of this specimen.');
	const manifestUrl = `${url.origin}/api/specimens/${id.data}/manifest`;
	const page = await manifestAnnotations(id.data, photoId.data, manifestUrl);
	if (!page) return problem(404, 'No such photograph of this specimen.');
	return json(page, 200, { 'content-type': MANIFEST_CONTENT_TYPE });
};
