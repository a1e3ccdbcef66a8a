import type { APIRoute } from 'astro';
import { z } from 'zod';
import { json, problem } from '../../../../lib/server/http.ts';
import { specimenManifest } from '../../../../lib/server/iiif/manifest.ts';
import { MANIFEST_CONTENT_TYPE } from '../../../../lib/iiif/manifest.ts';

/** The specimen's photographs as an IIIF Presentation 3 manifest; every id is built from this address. */
export const GET: APIRoute = async ({ params, url }) => {
	const id = z.uuid().safeParse(params.id);
	if (!id.success) return problem(404, 'No such specimen.');
	const manifest = await specimenManifest(id.data, `${url.origin}${url.pathname.replace(/\/+$/, '')}`, url.origin);
	if (!manifest) return problem(404, 'No such specimen.');
	return json(manifest, 200, { 'content-type': MANIFEST_CONTENT_TYPE });
};
