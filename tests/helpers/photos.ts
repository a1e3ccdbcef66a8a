import fs from 'node:fs';
import crypto from 'node:crypto';
import sharp from 'sharp';
import * as tus from 'tus-js-client';
import { baseUrl, call } from './server.ts';
import { specimenRecord } from './specimens.ts';

/**
 * Photo uploads from Node as a real tus client (tus-js-client) would send them, plus the records
 * and images the photo tests need.
 */
export interface TusOptions {
	cookie?: string;
	meta: Record<string, string>;
	chunkSize?: number;
	/** Resume this upload instead of creating one. */
	uploadUrl?: string;
	endpoint?: string;
	origin?: string;
	/** tus-js-client's retry delays; none by default, so a test sees the first failure. */
	retryDelays?: number[];
	onProgress?: (sent: number, total: number) => void;
	/** After each PATCH the server accepted: the bytes it took, the new offset, the total. */
	onChunkComplete?: (chunkSize: number, accepted: number, total: number) => void;
	/** Every request the client is about to send (method, URL, headers), e.g. to read Upload-Offset. */
	onBeforeRequest?: (req: tus.HttpRequest) => void;
	onAfterResponse?: (req: tus.HttpRequest, res: tus.HttpResponse) => void;
	/** Called with the Upload object once it has started, so a test can abort it. */
	started?: (u: tus.Upload) => void;
}

/**
 * Starts an upload and hands back the client itself (to abort it) with a promise of the outcome.
 * A file path is streamed from disk (tus-js-client slices it with fs read streams), never read
 * whole into memory. An aborted upload's promise never settles: tus-js-client reports no error
 * for an abort the caller asked for.
 */
export function tusStart(data: Buffer | string, o: TusOptions): { upload: tus.Upload; done: Promise<{ url: string; id: string }> } {
	const input = typeof data === 'string' ? fs.createReadStream(data) : data;
	const size = typeof data === 'string' ? fs.statSync(data).size : data.length;
	let upload!: tus.Upload;
	const done = new Promise<{ url: string; id: string }>((resolve, reject) => {
		upload = new tus.Upload(input, {
			endpoint: o.endpoint ?? `${baseUrl()}/api/uploads/`,
			uploadUrl: o.uploadUrl,
			uploadSize: size,
			chunkSize: o.chunkSize ?? (typeof data === 'string' ? 8 * 1024 * 1024 : Infinity),
			retryDelays: o.retryDelays ?? [],
			metadata: o.meta,
			headers: { ...(o.cookie ? { cookie: o.cookie } : {}), origin: o.origin ?? new URL(o.endpoint ?? baseUrl()).origin },
			storeFingerprintForResuming: false,
			onProgress: o.onProgress,
			onChunkComplete: o.onChunkComplete,
			onBeforeRequest: o.onBeforeRequest,
			onAfterResponse: o.onAfterResponse,
			onError: (err) => reject(err),
			onSuccess: () => resolve({ url: upload.url!, id: uploadIdOf(upload.url!) }),
		});
	});
	upload.start();
	o.started?.(upload);
	return { upload, done };
}

export function tusUpload(data: Buffer | string, o: TusOptions): Promise<{ url: string; id: string }> {
	return tusStart(data, o).done;
}

/** tus 1.0.0 §HEAD: the server's offset and length for an upload, read with the owner's cookie. */
export async function tusHead(url: string, cookie: string): Promise<{ status: number; offset: number; length: number; cacheControl: string | null }> {
	const res = await fetch(url, { method: 'HEAD', headers: { cookie, 'tus-resumable': '1.0.0' } });
	return { status: res.status, offset: Number(res.headers.get('upload-offset')), length: Number(res.headers.get('upload-length')), cacheControl: res.headers.get('cache-control') };
}

/** tus 1.0.0 Upload-Metadata: comma-separated `key base64(value)` pairs. */
export const tusMetadata = (m: Record<string, string>) =>
	Object.entries(m)
		.map(([k, v]) => `${k} ${Buffer.from(v).toString('base64')}`)
		.join(',');

export const uploadIdOf = (url: string) => new URL(url, baseUrl()).pathname.split('/').pop()!;

export async function makeSpecimen(cookie: string, prefix = 'PHT', base?: string): Promise<string> {
	const res = await call('/api/specimens', { cookie, json: specimenRecord(`${prefix}.${process.pid}`), ...(base ? { base } : {}) });
	if (res.status !== 201) throw new Error(`specimen: ${res.status} ${await res.text()}`);
	return ((await res.json()) as { specimen: { id: string } }).specimen.id;
}

export async function openCheck(cookie: string, specimenId: string): Promise<{ id: string; version: number }> {
	const res = await call(`/api/specimens/${specimenId}/checks`, { cookie, json: {} });
	if (res.status !== 201) throw new Error(`check: ${res.status} ${await res.text()}`);
	const { check } = (await res.json()) as { check: { id: string; version: number } };
	return check;
}

export interface UploadStatusBody {
	id: string;
	state: string;
	code: string | null;
	reason: string | null;
	photoId: string | null;
}

/** Polls the status endpoint until the upload is recorded, refused or quarantined. */
export async function settled(cookie: string, id: string, ms = 60_000, base?: string): Promise<UploadStatusBody> {
	const until = Date.now() + ms;
	while (Date.now() < until) {
		const res = await call(`/api/uploads/status?id=${id}`, { cookie, ...(base ? { base } : {}) });
		const [u] = ((await res.json()) as { uploads: UploadStatusBody[] }).uploads;
		if (u && ['recorded', 'refused', 'quarantined'].includes(u.state)) return u;
		await new Promise((r) => setTimeout(r, 150));
	}
	throw new Error(`upload ${id} did not settle within ${ms} ms`);
}

export const sha256 = (b: Buffer) => crypto.createHash('sha256').update(b).digest('hex');

/** SHA-256 (hex) of a file or of its first `length` bytes, streamed: big test files stay on disk. */
export async function sha256OfFile(file: string, length?: number): Promise<string> {
	const hash = crypto.createHash('sha256');
	const range = length === undefined ? {} : { start: 0, end: length - 1 };
	if (length !== 0) for await (const chunk of fs.createReadStream(file, { ...range, highWaterMark: 1024 * 1024 })) hash.update(chunk as Buffer);
	return hash.digest('hex');
}

/**
 * An uncompressed RGB TIFF of width × height pixels written to `file` (3 bytes a pixel plus a
 * small header): smooth noise scaled up, so every row differs (a shifted or repeated block
 * changes the hash) and the worker's JPEG tiles still compress well. Written by sharp straight to
 * the file; callers stream it from there.
 */
export async function writeTiff(file: string, width: number, height: number): Promise<number> {
	const seed = await sharp({ create: { width: 96, height: 96, channels: 3, background: '#808080', noise: { type: 'gaussian', mean: 128, sigma: 60 } } }).png().toBuffer();
	await sharp(seed).resize(width, height, { kernel: 'cubic' }).tiff({ compression: 'none' }).toFile(file);
	return fs.statSync(file).size;
}

/** A photograph-like JPEG: a smooth gradient with some structure, so it compresses like one. */
export async function sampleJpeg(width = 1600, height = 1200, exif?: Record<string, Record<string, string>>): Promise<Buffer> {
	const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}"><defs><linearGradient id="g" x1="0" y1="0" x2="1" y2="1"><stop offset="0" stop-color="#5b7a99"/><stop offset="1" stop-color="#d9c27e"/></linearGradient></defs><rect width="100%" height="100%" fill="url(#g)"/><circle cx="${width / 2}" cy="${height / 2}" r="${Math.min(width, height) / 3}" fill="#8a5a3c" opacity="0.7"/></svg>`;
	let img = sharp(Buffer.from(svg)).jpeg({ quality: 88 });
	if (exif) img = img.withExif(exif);
	return img.toBuffer();
}

/** A front photo uploaded over tus to a specimen (and a check), waited for until recorded; its photo id. */
export async function uploadPhoto(cookie: string, specimen: string, name: string, checkId?: string): Promise<string> {
	const meta: Record<string, string> = { filename: name, filetype: 'image/jpeg', specimenId: specimen, view: 'front', stage: 'as-found', ...(checkId ? { checkId } : {}) };
	const { id } = await tusUpload(await sampleJpeg(1200, 900), { cookie, meta });
	const done = await settled(cookie, id);
	if (!done.photoId) throw new Error(`upload ${name}: ${done.state} ${done.reason}`);
	return done.photoId;
}
