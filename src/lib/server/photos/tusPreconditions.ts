import { MAX_UPLOAD_BYTES } from '../../photos/limits.ts';

/**
 * What tus 1.0.0 says about a request before any handler may look at it, where @tus/server 2.4
 * answers otherwise (it says 400 to each of these):
 * - §Tus-Resumable: a version the server does not support is a 412 that names the versions it does
 *   (Tus-Version), and the request is not processed;
 * - §PATCH: a body of any type but application/offset+octet-stream is a 415;
 * - §Upload-Length / §Tus-Max-Size: a length over the maximum is a 413, however many digits it has
 *   (@tus/server refuses integers beyond 2^53 as malformed);
 * and one rule of ours: uploads are created only at the creation URL itself, never at an address
 * under it, so a path in a POST (`/api/uploads/..%2Fx`) means nothing and is a 404.
 */
export const TUS_VERSION = '1.0.0';

const answer = (status: number, body: string, extra: Record<string, string> = {}) =>
	new Response(`${body}\n`, { status, headers: { 'content-type': 'text/plain; charset=utf-8', 'tus-resumable': TUS_VERSION, ...extra } });

export function tusPrecondition(request: Request, creationPath: string): Response | null {
	const method = request.method.toUpperCase();
	if (method === 'OPTIONS') return null;
	if (request.headers.get('tus-resumable') !== TUS_VERSION) {
		return answer(412, `This server speaks tus ${TUS_VERSION}; send Tus-Resumable: ${TUS_VERSION}.`, { 'tus-version': TUS_VERSION });
	}
	if (method === 'POST') {
		const path = new URL(request.url).pathname.replace(/\/$/, '');
		if (path !== creationPath) return answer(404, 'Uploads are created at the upload address itself.');
		const length = request.headers.get('upload-length');
		if (length !== null && /^\d+$/.test(length) && BigInt(length) > BigInt(MAX_UPLOAD_BYTES)) {
			return answer(413, 'The file is larger than the upload limit.', { 'tus-max-size': String(MAX_UPLOAD_BYTES) });
		}
	}
	if (method === 'PATCH' && request.headers.get('content-type') !== 'application/offset+octet-stream') {
		return answer(415, 'Send the bytes as application/offset+octet-stream.');
	}
	return null;
}
