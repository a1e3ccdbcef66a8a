import http from 'node:http';
import { baseUrl, call } from './server.ts';
import { tusMetadata } from './photos.ts';

/** tus requests written by hand, for the tests that stall a body or send other bytes than a file's. */

/** tus 1.0.0 §POST (creation extension): a new upload of `size` bytes on `base`; its absolute URL. */
export async function createUpload(cookie: string, size: number, meta: Record<string, string>, base = baseUrl()): Promise<string> {
	const res = await call('/api/uploads/', { method: 'POST', cookie, base, headers: { 'tus-resumable': '1.0.0', 'upload-length': String(size), 'upload-metadata': tusMetadata(meta) } });
	if (res.status !== 201) throw new Error(`tus creation: ${res.status} ${await res.text()}`);
	return new URL(res.headers.get('location')!, base).href;
}

export type RawOutcome = { status: number; offset: string | undefined } | { error: string };

/**
 * A PATCH whose body the test writes itself (to stall it, or to send other bytes than the file's):
 * tus 1.0.0 §PATCH needs Upload-Offset and Content-Type: application/offset+octet-stream. The
 * request goes to the host of `url`, with that host's Origin.
 */
export function rawPatch(url: string, offset: number, length: number, cookie: string): { req: http.ClientRequest; response: Promise<RawOutcome> } {
	const u = new URL(url);
	const req = http.request({
		host: u.hostname,
		port: u.port,
		path: u.pathname,
		method: 'PATCH',
		headers: { cookie, origin: u.origin, 'tus-resumable': '1.0.0', 'upload-offset': String(offset), 'content-type': 'application/offset+octet-stream', 'content-length': String(length) },
	});
	const response = new Promise<RawOutcome>((resolve) => {
		req.on('response', (res) => {
			res.resume();
			resolve({ status: res.statusCode ?? 0, offset: res.headers['upload-offset'] as string | undefined });
		});
		// Also after the response: writing to a socket the server closed (EPIPE) is expected here.
		req.on('error', (err) => resolve({ error: err.message }));
	});
	return { req, response };
}
