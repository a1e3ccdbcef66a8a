import type { APIRoute } from 'astro';
import { z } from 'zod';
import { problem } from '../../../../lib/server/http.ts';
import { Photo } from '../../../../lib/server/models/index.ts';
import { attachmentName, serveFile } from '../../../../lib/server/photos/files.ts';
import { resolveStored } from '../../../../lib/server/photos/storage.ts';
import { audit } from '../../../../lib/server/audit.ts';

/**
 * The master original, byte for byte as uploaded (with its EXIF, GPS included), as a download.
 * Range requests are honoured so a large TIFF can be fetched in parts or resumed.
 */
export const GET: APIRoute = async ({ params, request, locals, clientAddress }) => {
	const id = z.uuid().safeParse(params.id);
	if (!id.success) return problem(404, 'No such photograph.');
	const photo = await Photo.findByPk(id.data);
	if (!photo) return problem(404, 'No such photograph.');
	if (request.method === 'GET' && !request.headers.get('range')) {
		await audit({ action: 'photo.original-downloaded', entityType: 'photo', entityId: photo.id, actorId: locals.user!.id, clientAddress });
	}
	return serveFile(request, resolveStored(photo.masterPath), {
		contentType: photo.mediaType,
		etag: photo.sha256,
		// The master never changes; its address always means these bytes.
		cacheControl: 'private, max-age=31536000, immutable',
		disposition: attachmentName(photo.fileName),
		ranges: true,
	});
};
