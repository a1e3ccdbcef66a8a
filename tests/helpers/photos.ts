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
	onProgress?: (sent: number, total: number) => void;
	/** Called with the Upload object once it has started, so a test can abort it. */
	started?: (u: tus.Upload) => void;
}

export function tusUpload(data: Buffer | string, o: TusOptions): Promise<{ url: string; id: string }> {
	const input = typeof data === 'string' ? fs.createReadStream(data) : data;
	const size = typeof data === 'string' ? fs.statSync(data).size : data.length;
	return new Promise((resolve, reject) => {
		const upload: tus.Upload = new tus.Upload(input, {
			endpoint: o.endpoint ?? `${baseUrl()}/api/uploads/`,
			uploadUrl: o.uploadUrl,
			uploadSize: size,
			chunkSize: o.chunkSize ?? (typeof data === 'string' ? 8 * 1024 * 1024 : Infinity),
			retryDelays: [],
			metadata: o.meta,
			headers: { ...(o.cookie ? { cookie: o.cookie } : {}), origin: o.origin ?? new URL(o.endpoint ?? baseUrl()).origin },
			storeFingerprintForResuming: false,
			onProgress: o.onProgress,
			onError: (err) => reject(err),
			onSuccess: () => resolve({ url: upload.url!, id: uploadIdOf(upload.url!) }),
		});
		upload.start();
		o.started?.(upload);
	});
}

export const uploadIdOf = (url: string) => new URL(url, baseUrl()).pathname.split('/').pop()!;

export async function makeSpecimen(cookie: string, prefix = 'PHT'): Promise<string> {
	const res = await call('/api/specimens', { cookie, json: specimenRecord(`${prefix}.${process.pid}`) });
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
export async function settled(cookie: string, id: string, ms = 60_000): Promise<UploadStatusBody> {
	const until = Date.now() + ms;
	while (Date.now() < until) {
		const res = await call(`/api/uploads/status?id=${id}`, { cookie });
		const [u] = ((await res.json()) as { uploads: UploadStatusBody[] }).uploads;
		if (u && ['recorded', 'refused', 'quarantined'].includes(u.state)) return u;
		await new Promise((r) => setTimeout(r, 150));
	}
	throw new Error(`upload ${id} did not settle within ${ms} ms`);
}

export const sha256 = (b: Buffer) => crypto.createHash('sha256').update(b).digest('hex');

/** A photograph-like JPEG: a smooth gradient with some structure, so it compresses like one. */
export async function sampleJpeg(width = 1600, height = 1200, exif?: Record<string, Record<string, string>>): Promise<Buffer> {
	const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}"><defs><linearGradient id="g" x1="0" y1="0" x2="1" y2="1"><stop offset="0" stop-color="#5b7a99"/><stop offset="1" stop-color="#d9c27e"/></linearGradient></defs><rect width="100%" height="100%" fill="url(#g)"/><circle cx="${width / 2}" cy="${height / 2}" r="${Math.min(width, height) / 3}" fill="#8a5a3c" opacity="0.7"/></svg>`;
	let img = sharp(Buffer.from(svg)).jpeg({ quality: 88 });
	if (exif) img = img.withExif(exif);
	return img.toBuffer();
}
