import fs from 'node:fs';
import fsp from 'node:fs/promises';
import { Readable } from 'node:stream';

/**
 * Serves a stored file as a web stream (a Node stream handed to Astro kills the process, STACK.md)
 * with the headers an immutable file deserves: its type, nosniff, an ETag from its hash, caching
 * for the signed-in user only, conditional requests and, where asked, byte ranges (RFC 9110 §14).
 */
export interface FileAnswer {
	contentType: string;
	etag: string;
	cacheControl: string;
	disposition?: string;
	ranges?: boolean;
}

const quoted = (etag: string) => `"${etag}"`;

function notModified(request: Request, etag: string): boolean {
	const inm = request.headers.get('if-none-match');
	if (!inm) return false;
	return inm.split(',').some((t) => t.trim().replace(/^W\//, '') === quoted(etag) || t.trim() === '*');
}

/** One byte range of `size`, or 'bad' when the header cannot be satisfied; multiple ranges are served whole. */
export function parseRange(header: string | null, size: number): { start: number; end: number } | 'bad' | null {
	if (!header) return null;
	const m = /^bytes=(\d*)-(\d*)$/.exec(header.trim());
	if (!m) return header.includes(',') ? null : 'bad';
	const [, a, b] = m;
	if (a === '' && b === '') return 'bad';
	let start: number;
	let end: number;
	if (a === '') {
		const suffix = Number(b);
		if (suffix === 0) return 'bad';
		start = Math.max(0, size - suffix);
		end = size - 1;
	} else {
		start = Number(a);
		end = b === '' ? size - 1 : Math.min(Number(b), size - 1);
	}
	if (start >= size || start > end) return 'bad';
	return { start, end };
}

export async function serveFile(request: Request, file: string, a: FileAnswer): Promise<Response> {
	let size: number;
	try {
		size = (await fsp.stat(file)).size;
	} catch {
		return new Response('The file is missing from storage; an administrator has been told.\n', { status: 503, headers: { 'content-type': 'text/plain; charset=utf-8', 'retry-after': '60' } });
	}
	const headers: Record<string, string> = {
		'content-type': a.contentType,
		etag: quoted(a.etag),
		'cache-control': a.cacheControl,
		'x-content-type-options': 'nosniff',
		// An image opened on its own cannot run anything, whatever is inside it.
		'content-security-policy': "default-src 'none'; img-src 'self'; style-src 'unsafe-inline'; sandbox",
		...(a.disposition ? { 'content-disposition': a.disposition } : {}),
		...(a.ranges ? { 'accept-ranges': 'bytes' } : {}),
	};
	if (notModified(request, a.etag)) return new Response(null, { status: 304, headers });
	const head = request.method === 'HEAD';
	const range = a.ranges ? parseRange(request.headers.get('range'), size) : null;
	if (range === 'bad') return new Response(null, { status: 416, headers: { ...headers, 'content-range': `bytes */${size}` } });
	const ifRange = request.headers.get('if-range');
	const partial = range && (!ifRange || ifRange === quoted(a.etag)) ? range : null;
	if (partial) {
		const length = partial.end - partial.start + 1;
		const body = head ? null : (Readable.toWeb(fs.createReadStream(file, { start: partial.start, end: partial.end })) as ReadableStream);
		return new Response(body, { status: 206, headers: { ...headers, 'content-length': String(length), 'content-range': `bytes ${partial.start}-${partial.end}/${size}` } });
	}
	const body = head ? null : (Readable.toWeb(fs.createReadStream(file)) as ReadableStream);
	return new Response(body, { status: 200, headers: { ...headers, 'content-length': String(size) } });
}

/** A header-safe download name: the original name where it is plain, with an RFC 6266 UTF-8 form. */
export function attachmentName(fileName: string): string {
	const ascii = fileName.replace(/[^\x20-\x7e]/g, '_').replace(/["\\;]/g, '_');
	return `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(fileName)}`;
}
