import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import sharp from 'sharp';
import exifr from 'exifr';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { call, rawRequest, useTestDatabase } from '../helpers/server.ts';
import { cookieFor, makeUser } from '../helpers/users.ts';
import { makeSpecimen, openCheck, sampleJpeg, settled, sha256, tusMetadata, tusUpload } from '../helpers/photos.ts';
import { Photo, PhotoUpload } from '../../src/lib/server/models/index.ts';

/**
 * Photographs through the real tus endpoint and the real worker: a good photo is recorded with its
 * hash, EXIF and derivatives; bad files are refused with their reason and nothing recorded; the
 * files are served only to those who may see them, with the right headers.
 */
let conservator: string;
let curator: string;
let specimenId: string;
let checkId: string;

beforeAll(async () => {
	useTestDatabase();
	conservator = await cookieFor((await makeUser('conservator', { tag: 'photo-c' })).user.id);
	curator = await cookieFor((await makeUser('curator', { tag: 'photo-k' })).user.id);
	specimenId = await makeSpecimen(conservator);
	checkId = (await openCheck(conservator, specimenId)).id;
});

const meta = (filename: string, over: Record<string, string> = {}) => ({ filename, filetype: 'image/jpeg', specimenId, checkId, view: 'front', stage: 'as-found', ...over });

/** EXIF as sharp writes it (CIPA DC-008 tag names); GPS in IFD3, the Exif IFD in IFD2. */
const cameraExif = {
	IFD0: { Make: 'Demo Optics', Model: 'Survey 24' },
	IFD2: { DateTimeOriginal: '2024:05:17 14:03:22', OffsetTimeOriginal: '+02:00', ExposureTime: '1/125', FNumber: '8/1', BodySerialNumber: 'SN-00417' },
	IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '51/1 30/1 0/1', GPSLongitudeRef: 'W', GPSLongitude: '0/1 7/1 30/1' },
};

describe('a good photograph', () => {
	let photoId: string;
	let bytes: Buffer;

	beforeAll(async () => {
		bytes = await sampleJpeg(2400, 1800, cameraExif);
		const { id } = await tusUpload(bytes, { cookie: conservator, meta: meta('STC-test front.jpg', { sha256: sha256(bytes) }) });
		const s = await settled(conservator, id);
		expect(s, JSON.stringify(s)).toMatchObject({ state: 'recorded' });
		photoId = s.photoId!;
	});

	it('is recorded with the hash of the bytes sent, its size and its EXIF', async () => {
		const res = await call(`/api/photos/${photoId}`, { cookie: conservator });
		expect(res.status).toBe(200);
		const { photo } = await res.json();
		expect(photo).toMatchObject({ sha256: sha256(bytes), byteSize: bytes.length, width: 2400, height: 1800, mediaType: 'image/jpeg', fileName: 'STC-test front.jpg', view: 'front', stage: 'as-found' });
		// The raw EXIF time and its offset are kept; the instant follows from both.
		expect(photo.captured).toEqual({ raw: '2024:05:17 14:03:22', offset: '+02:00', at: '2024-05-17T12:03:22.000Z' });
		expect(photo.camera).toBe('Demo Optics Survey 24');
		expect(photo.exif.exposure.exposureTime).toBeCloseTo(1 / 125, 6);
		expect(photo.exif.private.gps.latitude).toBeCloseTo(51.5, 6);
		expect(photo.exif.private.gps.longitude).toBeCloseTo(-0.125, 6);
		expect(photo.exif.private.bodySerial).toBe('SN-00417');
		expect(photo.check).toMatchObject({ id: checkId });
	});

	it('hides the GPS position and serial numbers, and the master, from a curator', async () => {
		const { photo } = await (await call(`/api/photos/${photoId}`, { cookie: curator })).json();
		expect(photo.exif.private).toBeUndefined();
		expect(photo.urls.original).toBeNull();
		expect((await call(`/api/photos/${photoId}/original`, { cookie: curator })).status).toBe(403);
	});

	it('serves the master byte for byte, with ranges and an ETag from its hash', async () => {
		const res = await call(`/api/photos/${photoId}/original`, { cookie: conservator });
		expect(res.status).toBe(200);
		expect(res.headers.get('etag')).toBe(`"${sha256(bytes)}"`);
		expect(res.headers.get('x-content-type-options')).toBe('nosniff');
		expect(res.headers.get('content-disposition')).toMatch(/^attachment;/);
		expect(sha256(Buffer.from(await res.arrayBuffer()))).toBe(sha256(bytes));
		const part = await call(`/api/photos/${photoId}/original`, { cookie: conservator, headers: { range: 'bytes=100-199' } });
		expect(part.status).toBe(206);
		expect(part.headers.get('content-range')).toBe(`bytes 100-199/${bytes.length}`);
		expect(Buffer.from(await part.arrayBuffer()).equals(bytes.subarray(100, 200))).toBe(true);
		const again = await call(`/api/photos/${photoId}/original`, { cookie: conservator, headers: { 'if-none-match': `"${sha256(bytes)}"` } });
		expect(again.status).toBe(304);
		expect((await call(`/api/photos/${photoId}/original`, { cookie: conservator, headers: { range: `bytes=${bytes.length}-` } })).status).toBe(416);
	});

	it('makes a thumbnail and a display copy with no EXIF and no GPS', async () => {
		for (const [kind, edge] of [['thumbnail', 400], ['display', 2048]] as const) {
			const res = await call(`/api/photos/${photoId}/${kind}`, { cookie: curator });
			expect(res.status).toBe(200);
			expect(res.headers.get('content-type')).toBe('image/jpeg');
			expect(res.headers.get('cache-control')).toMatch(/^private/);
			const buf = Buffer.from(await res.arrayBuffer());
			const m = await sharp(buf).metadata();
			expect(Math.max(m.width!, m.height!)).toBe(edge);
			expect(m.exif).toBeUndefined();
			expect(await exifr.gps(buf).catch(() => undefined)).toBeUndefined();
		}
	});

	it('publishes a valid IIIF Image API 3 info.json whose tiles decode', async () => {
		const res = await call(`/api/photos/${photoId}/tiles/info.json`, { cookie: curator });
		expect(res.status).toBe(200);
		const info = await res.json();
		// IIIF Image API 3.0 §5 (image information): these properties are required.
		expect(info['@context']).toBe('http://iiif.io/api/image/3/context.json');
		expect(info.type).toBe('ImageService3');
		expect(info.protocol).toBe('http://iiif.io/api/image');
		expect(info.profile).toBe('level0');
		expect(info.id).toMatch(new RegExp(`/api/photos/${photoId}/tiles$`));
		expect([info.width, info.height]).toEqual([2400, 1800]);
		const tile = info.tiles[0];
		expect(tile.width).toBe(512);
		expect(tile.scaleFactors).toContain(1);
		const first = await call(`/api/photos/${photoId}/tiles/0,0,512,512/512,512/0/default.jpg`, { cookie: curator });
		expect(first.status).toBe(200);
		const m = await sharp(Buffer.from(await first.arrayBuffer())).metadata();
		expect([m.width, m.height]).toEqual([512, 512]);
	});

	it('refuses tile paths of any other shape', async () => {
		// Sent as raw request lines: fetch would resolve the dot segments before sending.
		for (const p of ['..%2F..%2Finfo.json', '0,0,512,512%2F..%2F..%2F..%2Fdisplay.jpg', 'vips-properties.xml', '0,0,512,512/512,512/0/default.png', '0,0,512,512/512,512/90/default.jpg']) {
			expect(await rawStatus(`/api/photos/${photoId}/tiles/${p}`, curator), p).toBe(404);
		}
		// Dot segments are resolved by the server before routing, so they cannot climb out of the folder.
		expect(await rawStatus(`/api/photos/${photoId}/tiles/../../../../../../../../etc/passwd`, curator)).not.toBe(200);
	});

	it('cannot be deleted or changed in the database', async () => {
		const row = await Photo.findByPk(photoId);
		await expect(row!.destroy()).rejects.toThrow(/cannot be deleted/);
		row!.fileName = 'renamed.jpg';
		await expect(row!.save()).rejects.toThrow(/cannot be changed/);
	});

	it('appears in the lists of its specimen and its check', async () => {
		const s = await (await call(`/api/specimens/${specimenId}/photos`, { cookie: curator })).json();
		expect(s.photos.map((p: { id: string }) => p.id)).toContain(photoId);
		const c = await (await call(`/api/checks/${checkId}/photos`, { cookie: curator })).json();
		expect(c.photos.map((p: { id: string }) => p.id)).toContain(photoId);
	});
});

/** A PNG whose header declares w × h pixels, with one tiny compressed row (PNG spec §11.2.2 IHDR). */
function pngDeclaring(w: number, h: number): Buffer {
	const crc32 = (buf: Buffer) => zlib.crc32(buf);
	const chunk = (type: string, data: Buffer) => {
		const len = Buffer.alloc(4);
		len.writeUInt32BE(data.length);
		const td = Buffer.concat([Buffer.from(type, 'ascii'), data]);
		const crc = Buffer.alloc(4);
		crc.writeUInt32BE(crc32(td) >>> 0);
		return Buffer.concat([len, td, crc]);
	};
	const ihdr = Buffer.alloc(13);
	ihdr.writeUInt32BE(w, 0);
	ihdr.writeUInt32BE(h, 4);
	ihdr[8] = 8; // bit depth
	ihdr[9] = 2; // truecolour
	return Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk('IHDR', ihdr), chunk('IDAT', zlib.deflateSync(Buffer.alloc(64))), chunk('IEND', Buffer.alloc(0))]);
}

describe('files that are not acceptable photographs', () => {
	const cases: [string, () => Promise<Buffer> | Buffer, RegExp][] = [
		['text named .jpg', () => Buffer.from('These are my notes about jar 14, not a photo.\n'), /text/i],
		['an SVG drawing', () => Buffer.from('<?xml version="1.0"?><svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>'), /SVG/],
		['an HTML page', () => Buffer.from('<!DOCTYPE html><html><body><script>alert(1)</script></body></html>'), /HTML/i],
		['a truncated JPEG', async () => (await sampleJpeg(800, 600)).subarray(0, 9000), /truncated|incomplete|cut off|end/i],
		['a PNG declaring 65,000 × 65,000 pixels', () => pngDeclaring(65000, 65000), /megapixels/],
		['a JPEG with a script appended', async () => Buffer.concat([await sampleJpeg(400, 300), Buffer.from('<script>alert(1)</script>')]), /attached|after the end/i],
	];

	it.each(cases)('refuses %s with its reason and records nothing', async (name, make, reason) => {
		const bytes = await make();
		const { id } = await tusUpload(bytes, { cookie: conservator, meta: meta(`${name}.jpg`) });
		const s = await settled(conservator, id);
		expect(s.state).toBe('refused');
		expect(s.reason).toMatch(reason);
		expect(await Photo.count({ where: { uploadId: id } })).toBe(0);
		// The server is still well.
		expect((await call('/api/me', { cookie: conservator })).status).toBe(200);
	});

	it('refuses an empty file when the upload is created', async () => {
		await expect(tusUpload(Buffer.alloc(0), { cookie: conservator, meta: meta('empty.jpg') })).rejects.toThrow(/empty/);
	});

	it('quarantines a file whose SHA-256 does not match what the uploader computed', async () => {
		const bytes = await sampleJpeg(500, 400);
		const { id } = await tusUpload(bytes, { cookie: conservator, meta: meta('mismatch.jpg', { sha256: 'ab'.repeat(32) }) });
		const s = await settled(conservator, id);
		expect(s.state).toBe('quarantined');
		expect(s.reason).toMatch(/SHA-256/);
		expect(await Photo.count({ where: { uploadId: id } })).toBe(0);
	});
});

describe('who may upload where', () => {
	it('refuses signed-out, reviewer and curator uploads', async () => {
		const bytes = await sampleJpeg(100, 100);
		await expect(tusUpload(bytes, { meta: meta('x.jpg') })).rejects.toThrow(/401/);
		const reviewer = await cookieFor((await makeUser('reviewer', { tag: 'photo-r' })).user.id);
		await expect(tusUpload(bytes, { cookie: reviewer, meta: meta('x.jpg') })).rejects.toThrow(/403/);
		await expect(tusUpload(bytes, { cookie: curator, meta: meta('x.jpg') })).rejects.toThrow(/403/);
	});

	it('validates the metadata when the upload is created', async () => {
		const bytes = await sampleJpeg(100, 100);
		await expect(tusUpload(bytes, { cookie: conservator, meta: meta('x.jpg', { view: 'sideways' }) })).rejects.toThrow(/view must be one of/);
		await expect(tusUpload(bytes, { cookie: conservator, meta: meta('x.jpg', { specimenId: 'not-a-uuid' }) })).rejects.toThrow(/specimen/);
		await expect(tusUpload(bytes, { cookie: conservator, meta: meta('x.jpg', { specimenId: '00000000-0000-4000-8000-000000000000' }) })).rejects.toThrow(/No such specimen/);
		const other = await makeSpecimen(conservator);
		await expect(tusUpload(bytes, { cookie: conservator, meta: meta('x.jpg', { specimenId: other }) })).rejects.toThrow(/another specimen/);
	});

	it('does not let another conservator continue, inspect or cancel my upload', async () => {
		const other = await cookieFor((await makeUser('conservator', { tag: 'photo-o' })).user.id);
		const create = await call('/api/uploads/', { method: 'POST', cookie: conservator, headers: { 'tus-resumable': '1.0.0', 'upload-length': '1000', 'upload-metadata': tusMetadata(meta('mine.jpg')) } });
		expect(create.status).toBe(201);
		const location = create.headers.get('location')!;
		expect(location).toMatch(/^\/api\/uploads\/[0-9a-f]{32}$/);
		expect(create.headers.get('access-control-allow-origin')).not.toBe('*');
		for (const method of ['HEAD', 'PATCH', 'DELETE']) {
			const res = await call(location, { method, cookie: other, headers: { 'tus-resumable': '1.0.0', 'upload-offset': '0', 'content-type': 'application/offset+octet-stream' } });
			expect(res.status, method).toBe(404);
		}
		expect((await call(location, { method: 'HEAD', cookie: conservator, headers: { 'tus-resumable': '1.0.0' } })).headers.get('upload-offset')).toBe('0');
		// Nothing is read back through tus.
		expect((await call(location, { cookie: conservator })).status).toBe(405);
		// The owner may cancel an unfinished upload.
		expect((await call(location, { method: 'DELETE', cookie: conservator, headers: { 'tus-resumable': '1.0.0' } })).status).toBe(204);
		expect((await PhotoUpload.findByPk(location.split('/').pop()!))?.refusalCode).toBe('cancelled');
	});

	it('refuses upload ids that are not plain hex', async () => {
		for (const id of ['..%2F..%2Fetc%2Fpasswd', '%2e%2e%2Fx', 'abc', 'A'.repeat(32)]) {
			const res = await call(`/api/uploads/${id}`, { method: 'HEAD', cookie: conservator, headers: { 'tus-resumable': '1.0.0' } });
			expect([400, 404]).toContain(res.status);
		}
	});

	it('does not delete a finished upload through tus', async () => {
		const { url } = await tusUpload(await sampleJpeg(200, 200), { cookie: conservator, meta: meta('keep.jpg') });
		const res = await call(new URL(url).pathname, { method: 'DELETE', cookie: conservator, headers: { 'tus-resumable': '1.0.0' } });
		expect(res.status).toBe(400);
	});
});

/** The status of a GET whose path is sent exactly as written. */
const rawStatus = async (path: string, cookie: string): Promise<number> => (await rawRequest('GET', path, { cookie })).status;

describe('derivative sets', () => {
	it('are replaced whole when remade, and the old set is removed', async () => {
		const { regenerateDerivatives } = await import('../../src/lib/server/photos/ingest.ts');
		const { PhotoDerivative } = await import('../../src/lib/server/models/index.ts');
		const bytes = await sampleJpeg(900, 700);
		const { id } = await tusUpload(bytes, { cookie: conservator, meta: meta('remake.jpg') });
		const { photoId } = await settled(conservator, id);
		const before = await Photo.findByPk(photoId!);
		const oldDir = path.join(inject('uploadsDir'), 'derivatives', photoId!, before!.derivativeSet);
		expect(fs.existsSync(oldDir)).toBe(true);
		const set = await regenerateDerivatives(photoId!);
		expect(set).not.toBe(before!.derivativeSet);
		expect(fs.existsSync(oldDir)).toBe(false);
		const rows = await PhotoDerivative.findAll({ where: { photoId: photoId! } });
		expect(rows.map((r) => r.setId)).toEqual([set, set, set]);
		expect((await Photo.findByPk(photoId!))!.sha256).toBe(sha256(bytes));
		expect((await call(`/api/photos/${photoId}/display`, { cookie: curator })).status).toBe(200);
	});
});

describe('the reconciler', () => {
	it('removes a half-made derivative set left by a run that died, and leaves a fresh one alone', async () => {
		const { reconcile } = await import('../../src/lib/server/photos/reconcile.ts');
		const work = path.join(inject('uploadsDir'), 'work');
		const stale = path.join(work, `stale${process.pid}`);
		const fresh = path.join(work, `fresh${process.pid}`);
		for (const d of [stale, fresh]) fs.mkdirSync(path.join(d, 'tiles'), { recursive: true });
		const twoHoursAgo = new Date(Date.now() - 2 * 3600_000);
		fs.utimesSync(stale, twoHoursAgo, twoHoursAgo);
		// The worker's own reconciler (every few seconds in the tests) may get there first; either way it goes.
		await reconcile(new Date(), async () => {});
		expect(fs.existsSync(stale)).toBe(false);
		expect(fs.existsSync(fresh)).toBe(true);
		fs.rmSync(fresh, { recursive: true });
	});
});

describe('fixity checks', () => {
	it('find a master altered on disk and one gone missing, and say so on the photo', async () => {
		const { fixityPass } = await import('../../src/lib/server/photos/fixity.ts');
		const [a, b] = (await Promise.all(['fixity-a.jpg', 'fixity-b.jpg'].map(async (name, i) => {
			const { id } = await tusUpload(await sampleJpeg(300 + i, 200), { cookie: conservator, meta: meta(name) });
			return (await settled(conservator, id)).photoId!;
		}))) as [string, string];
		const recorded = await (await call(`/api/photos/${a}`, { cookie: conservator })).json();
		expect(recorded.photo.fixity.outcome).toBe('match');
		const masterOf = async (id: string) => path.join(inject('uploadsDir'), (await Photo.findByPk(id))!.masterPath);
		const fileA = await masterOf(a);
		const fileB = await masterOf(b);
		const original = fs.readFileSync(fileA);
		fs.chmodSync(fileA, 0o644);
		const altered = Buffer.from(original);
		altered[altered.length - 10] = altered[altered.length - 10]! ^ 0xff;
		fs.writeFileSync(fileA, altered);
		fs.renameSync(fileB, `${fileB}.away`);
		try {
			const later = new Date(Date.now() + 30 * 86_400_000);
			const report = await fixityPass({ olderThanDays: 7, byteBudget: 10 * 1024 ** 3, now: later });
			expect(report.problems).toEqual(expect.arrayContaining([{ photoId: a, outcome: 'mismatch' }, { photoId: b, outcome: 'missing' }]));
			const shown = await (await call(`/api/photos/${a}`, { cookie: conservator })).json();
			expect(shown.photo.fixity.outcome).toBe('mismatch');
		} finally {
			fs.writeFileSync(fileA, original);
			fs.chmodSync(fileA, 0o444);
			fs.renameSync(`${fileB}.away`, fileB);
		}
	});
});
