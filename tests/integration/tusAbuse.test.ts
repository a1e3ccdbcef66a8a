import fs from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { call, rawRequest, useTestDatabase } from '../helpers/server.ts';
import { signedInUser } from '../helpers/users.ts';
import { newSpecimen } from '../helpers/checks.ts';
import { sampleJpeg, settled, tusHead, tusMetadata, tusUpload } from '../helpers/photos.ts';
import { MAX_UPLOAD_BYTES } from '../../src/lib/photos/limits.ts';

/**
 * TESTPLAN B4 (tus 1.0.0 protocol; @tus/server; ASVS 5.0 5.2.1 size cap, 5.3.2 server-made paths,
 * 5.4.1 safe download name): tus requests with broken headers, ids that try to leave the uploads
 * folder, and hostile file names. Each gets the status the protocol names (400, 404, 409, 412, 413,
 * 415), never a 500, and no file appears anywhere but under the uploads folder, named by the server.
 * (photoUpload.test.ts covers HEAD on ids that are not hex, and another person's upload URL.)
 */
let cookie: string;
let specimenId: string;
const TUS = { 'tus-resumable': '1.0.0' };

beforeAll(async () => {
	useTestDatabase();
	({ cookie } = await signedInUser('conservator', 'tus-abuse'));
	specimenId = (await newSpecimen(cookie, `TUS.${process.pid}`)).id;
});

const meta = (over: Record<string, string> = {}) => tusMetadata({ filename: 'jar.jpg', filetype: 'image/jpeg', specimenId, view: 'front', stage: 'as-found', ...over });
const create = (headers: Record<string, string>) => call('/api/uploads/', { method: 'POST', cookie, headers: { ...TUS, 'upload-length': '1000', 'upload-metadata': meta(), ...headers } });

async function newUpload(length = 1000): Promise<string> {
	const res = await create({ 'upload-length': String(length) });
	expect(res.status).toBe(201);
	return res.headers.get('location')!;
}

const patch = (location: string, headers: Record<string, string>, body: Buffer) =>
	call(location, { method: 'PATCH', cookie, raw: body as unknown as string, headers: { ...TUS, 'content-type': 'application/offset+octet-stream', 'upload-offset': '0', ...headers } });

/** The names in a folder and, one level down, in its folders: enough to see a stray file or folder. */
function tree(dir: string): string[] {
	return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() && e.name !== 'pg' ? [e.name, ...fs.readdirSync(path.join(dir, e.name)).map((n) => `${e.name}/${n}`)] : [e.name]));
}

describe('creating an upload (tus 1.0.0 §Creation)', () => {
	it('must 412 without the protocol version this server speaks, and say which it speaks', async () => {
		for (const version of [undefined, '0.2.2', '2.0.0', '1.0.0, 0.2.2']) {
			const res = await call('/api/uploads/', { method: 'POST', cookie, headers: { 'upload-length': '1000', 'upload-metadata': meta(), ...(version ? { 'tus-resumable': version } : {}) } });
			expect(res.status, String(version)).toBe(412);
			expect(res.headers.get('tus-version')).toBe('1.0.0');
		}
	});

	it('must 413 for a length over the limit, however large, and 400 for one that is no length', async () => {
		for (const length of [String(MAX_UPLOAD_BYTES + 1), '1' + '0'.repeat(30)]) expect((await create({ 'upload-length': length })).status, length).toBe(413);
		for (const length of ['-1', 'abc', '1.5', '0x10', '1e3', '']) expect((await create({ 'upload-length': length })).status, JSON.stringify(length)).toBe(400);
		// Deferred lengths are not accepted: the size is checked before any byte arrives.
		const deferred = await call('/api/uploads/', { method: 'POST', cookie, headers: { ...TUS, 'upload-defer-length': '1', 'upload-metadata': meta() } });
		expect(deferred.status).toBe(400);
	});

	it('must 400 on metadata that is malformed, or holds a NUL or a line break in the file name', async () => {
		const bad = [
			'filename',
			'filename !!!not-base64!!!',
			`filename ${Buffer.from('a.jpg').toString('base64')},filename ${Buffer.from('b.jpg').toString('base64')}`,
			meta({ filename: 'jar\u0000.jpg' }),
			meta({ filename: 'jar.jpg\r\nX-Injected: 1' }),
			meta({ specimenId: "' OR 1=1 --" }),
		];
		for (const m of bad) expect((await create({ 'upload-metadata': m })).status, m).toBe(400);
	});
});

describe('sending bytes (tus 1.0.0 §PATCH)', () => {
	it('must 409 at the wrong offset and keep the offset it had', async () => {
		const location = await newUpload();
		expect((await patch(location, { 'upload-offset': '5' }, Buffer.alloc(10))).status).toBe(409);
		expect((await tusHead(new URL(location, inject('baseUrl')).href, cookie)).offset).toBe(0);
	});

	it('must 400 on an offset that is no number, 412 on another version, 415 on another content type', async () => {
		const location = await newUpload();
		for (const offset of ['-1', 'abc', '']) expect((await patch(location, { 'upload-offset': offset }, Buffer.alloc(10))).status, JSON.stringify(offset)).toBe(400);
		expect((await patch(location, { 'tus-resumable': '0.2.2' }, Buffer.alloc(10))).status).toBe(412);
		expect((await patch(location, { 'content-type': 'application/json' }, Buffer.alloc(10))).status).toBe(415);
		expect((await tusHead(new URL(location, inject('baseUrl')).href, cookie)).offset).toBe(0);
	});

	it('must 413 on more bytes than the upload declared, and never keep more than that', async () => {
		const location = await newUpload(100);
		const res = await patch(location, {}, Buffer.alloc(200, 1));
		expect(res.status).toBe(413);
		const head = await tusHead(new URL(location, inject('baseUrl')).href, cookie);
		expect(head.offset).toBeLessThanOrEqual(100);
		expect(fs.statSync(path.join(inject('uploadsDir'), 'incoming', location.split('/').pop()!)).size).toBeLessThanOrEqual(100);
	});
});

describe('upload ids that try to leave the uploads folder', () => {
	it('are 400 or 404 for every tus method, never 500 nor a success, and nothing is written outside', async () => {
		const root = path.dirname(inject('uploadsDir'));
		const before = tree(root);
		const hex = 'ab'.repeat(16);
		const ids = ['../../../../tmp/hi-escape', '..%2F..%2F..%2Ftmp%2Fhi-escape', '%2e%2e%2f%2e%2e%2fhi-escape', `${hex}%00`, `${hex}%00.json`, `${hex}%2F..%2F${hex}`, `..%252F${hex}`, `${hex}/../${hex}`, `${hex}\\..\\x`];
		for (const id of ids) {
			for (const method of ['HEAD', 'PATCH', 'DELETE', 'POST']) {
				const res = await rawRequest(method, `/api/uploads/${id}`, { cookie, ...TUS, 'upload-offset': '0', 'upload-length': '10', 'content-type': 'application/offset+octet-stream', 'upload-metadata': meta() }, method === 'PATCH' ? 'x'.repeat(10) : undefined);
				expect([400, 404, 405], `${method} ${id}: ${res.status} ${res.body}`).toContain(res.status);
			}
		}
		// Other test files write at the same time (mail, their own uploads), so what is new may only be
		// the fake mailbox's messages and server-made names (hex or uuid) inside the uploads folder.
		const added = tree(root).filter((n) => !before.includes(n));
		const uploads = path.basename(inject('uploadsDir'));
		for (const n of added) expect(n, n).toMatch(new RegExp(`^(mailbox/[^/]+|${uploads}/[a-z]+|${uploads}/[a-z]+/[0-9a-f-]+(\\.json)?)$`));
		expect(fs.existsSync('/tmp/hi-escape')).toBe(false);
	});
});

describe('a hostile file name', () => {
	it('is only a label: the bytes are stored under the server’s id, and the download name cannot break its header', async () => {
		const name = '../../"; filename=evil.html; x=\\ ü.jpg';
		const { id } = await tusUpload(await sampleJpeg(120, 90), { cookie, meta: { filename: name, filetype: 'image/jpeg', specimenId, view: 'front', stage: 'as-found' } });
		expect(id).toMatch(/^[0-9a-f]{32}$/);
		const photoId = (await settled(cookie, id)).photoId!;
		const res = await call(`/api/photos/${photoId}/original`, { cookie });
		expect(res.status).toBe(200);
		// RFC 6266: one attachment, the plain name without quotes, backslashes or semicolons, the exact one percent-encoded.
		expect(res.headers.get('content-disposition')).toBe(`attachment; filename="../../__ filename=evil.html_ x=_ _.jpg"; filename*=UTF-8''${encodeURIComponent(name)}`);
		expect(fs.existsSync(path.join(inject('uploadsDir'), '..', 'evil.html'))).toBe(false);
	});
});
