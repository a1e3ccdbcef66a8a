import crypto from 'node:crypto';
import fs from 'node:fs';
import fsp from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import type * as tus from 'tus-js-client';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { freePort } from '../../db/cluster.mjs';
import { stopService, type Service } from '../../scripts/lib/proc.mjs';
import { startApp } from '../helpers/apps.ts';
import { createUpload, rawPatch } from '../helpers/tusRaw.ts';
import { call, useTestDatabase } from '../helpers/server.ts';
import { cookieFor, makeUser } from '../helpers/users.ts';
import { makeSpecimen, openCheck, sampleJpeg, settled, sha256, sha256OfFile, tusHead, tusMetadata, tusStart, tusUpload, writeTiff } from '../helpers/photos.ts';
import { db } from '../../src/lib/server/db.ts';
import { AuditEvent, Photo, PhotoUpload } from '../../src/lib/server/models/index.ts';
import { finishUpload } from '../../src/lib/server/photos/uploads.ts';

/**
 * Resumable uploads under faults, with real tus clients (tus-js-client from Node), the real server
 * and the real worker (TESTPLAN F1–F3 and the reconciler of F2): a client that stops and resumes,
 * a server killed with SIGKILL mid-PATCH, two clients writing one upload at once, bytes that
 * arrived but were never recorded, and uploads to checks that can no longer change.
 *
 * Protocol references are to tus 1.0.0 (tus-resumable-upload-protocol, protocol.md) §Core Protocol;
 * the lock behaviour is @tus/server 2.4.5's MemoryLocker, kept across processes by our PgLocker
 * (a second request for a locked upload asks the holder to let go; the holder stops reading after
 * lockDrainTimeout, 3 s by default).
 */
const MiB = 1024 * 1024;
let tmp: string;
let conservator: string;
let conservatorId: string;
let specimenId: string;
let checkId: string;
/** ~201 MB (8200 × 8200 × 3 bytes, 67 megapixels): the size of a large TIFF master. */
const big = { file: '', size: 0, sha: '' };
/** ~24 MB, for the lock tests, where only the order of bytes matters. */
const mid = { file: '', size: 0, sha: '' };

beforeAll(async () => {
	useTestDatabase();
	db();
	tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'meniscus-resume-'));
	const { user } = await makeUser('conservator', { tag: 'resume-c' });
	conservatorId = user.id;
	conservator = await cookieFor(user.id);
	specimenId = await makeSpecimen(conservator, 'RES');
	checkId = (await openCheck(conservator, specimenId)).id;
	// Made once per run and streamed from disk by every client below; never held in memory.
	big.file = path.join(tmp, 'big.tif');
	big.size = await writeTiff(big.file, 8200, 8200);
	big.sha = await sha256OfFile(big.file);
	mid.file = path.join(tmp, 'mid.tif');
	mid.size = await writeTiff(mid.file, 2800, 2800);
	mid.sha = await sha256OfFile(mid.file);
}, 120_000);

afterAll(() => {
	if (tmp) fs.rmSync(tmp, { recursive: true, force: true });
});

const meta = (filename: string, over: Record<string, string> = {}) => ({ filename, filetype: 'image/tiff', specimenId, checkId, view: 'front', stage: 'as-found', ...over });

/** The photo the worker recorded for an upload, as the API shows it. */
async function recordedPhoto(id: string, cookie = conservator) {
	const s = await settled(cookie, id, 90_000);
	expect(s, JSON.stringify(s)).toMatchObject({ state: 'recorded' });
	const res = await call(`/api/photos/${s.photoId}`, { cookie });
	expect(res.status).toBe(200);
	return (await res.json()).photo as { id: string; sha256: string; byteSize: number; width: number; height: number; mediaType: string };
}

/** A resumed upload's own account of what it sent: the offset of each PATCH and the bytes taken. */
function resumeProbe() {
	const probe = { patchOffsets: [] as number[], accepted: 0, firstProgress: undefined as number | undefined };
	return {
		probe,
		options: {
			onBeforeRequest: (req: tus.HttpRequest) => {
				if (req.getMethod() === 'PATCH') probe.patchOffsets.push(Number(req.getHeader('Upload-Offset')));
			},
			onChunkComplete: (chunk: number) => {
				probe.accepted += chunk;
			},
			onProgress: (sent: number) => {
				probe.firstProgress ??= sent;
			},
		},
	};
}

describe('a client that stops part way and resumes', () => {
	it('continues from the offset the server kept, sends only the rest, and the worker records the exact bytes', async () => {
		// One PATCH for the whole file (chunkSize Infinity, as Uppy sends), so the abort cuts a
		// request in the middle rather than between chunks.
		let aborting: Promise<void> | undefined;
		let client: tus.Upload | undefined;
		const first = tusStart(big.file, {
			cookie: conservator,
			meta: meta('resume-after-abort.tif'),
			chunkSize: Infinity,
			started: (u) => (client = u),
			onProgress: (sent, total) => {
				if (!aborting && sent >= 0.4 * total) aborting = client!.abort();
			},
		});
		first.done.catch(() => {});
		await expect.poll(() => aborting !== undefined, { timeout: 60_000, interval: 50 }).toBe(true);
		await aborting;
		const url = client!.url!;
		const id = url.split('/').pop()!;

		// tus 1.0.0 §HEAD: the offset the server kept, never cached ("Cache-Control: no-store"); the
		// server SHOULD keep the bytes of an interrupted PATCH (§PATCH), so a resume does not start over.
		const head = await waitForSettledHead(url);
		expect(head.status).toBe(200);
		expect(head.cacheControl).toBe('no-store');
		expect(head.length).toBe(big.size);
		expect(head.offset).toBeGreaterThan(0);
		expect(head.offset).toBeLessThan(big.size);
		// What is on disk is exactly the start of the file: no byte lost or doubled at the cut.
		expect(await sha256OfFile(incomingPath(id))).toBe(await sha256OfFile(big.file, head.offset));

		const { probe, options } = resumeProbe();
		const resumed = await tusUpload(big.file, { cookie: conservator, meta: meta('resume-after-abort.tif'), uploadUrl: url, chunkSize: Infinity, ...options });
		// The same upload (tus-js-client would silently create a new one if the HEAD had failed).
		expect(resumed.id).toBe(id);
		expect(probe.patchOffsets[0]).toBe(head.offset);
		expect(probe.accepted).toBe(big.size - head.offset);
		expect(probe.firstProgress).toBeGreaterThanOrEqual(head.offset);

		const photo = await recordedPhoto(id);
		expect(photo).toMatchObject({ sha256: big.sha, byteSize: big.size, width: 8200, height: 8200, mediaType: 'image/tiff' });
	}, 120_000);
});

describe('the app server killed with SIGKILL in the middle of a PATCH', () => {
	// A second app of our own on the same database and uploads folder, so the global worker
	// records what it receives; the global server is never touched.
	let app2: Service | undefined;
	let url2 = '';

	afterAll(async () => {
		await stopService(app2);
	});

	it('resumes on the restarted server from the bytes that reached the disk, and the photo matches the file', async () => {
		const port = await freePort();
		url2 = `http://127.0.0.1:${port}`;
		app2 = await startApp('app2', port);
		const killed = app2;
		let client: tus.Upload | undefined;
		let kill = false;
		const first = tusStart(big.file, {
			cookie: conservator,
			endpoint: `${url2}/api/uploads/`,
			meta: meta('server-killed.tif'),
			chunkSize: Infinity,
			started: (u) => (client = u),
			onProgress: (sent, total) => {
				if (!kill && sent >= 0.3 * total) {
					kill = true;
					killed.kill('SIGKILL');
				}
			},
		});
		await expect(first.done).rejects.toThrow();
		expect(await killed.exited).toMatchObject({ signal: 'SIGKILL' });
		const url = client!.url!;
		expect(url.startsWith(`${url2}/api/uploads/`)).toBe(true);
		const id = url.split('/').pop()!;

		app2 = await startApp('app2', port);
		const head = await tusHead(url, conservator);
		expect(head.status).toBe(200);
		expect(head.offset).toBeGreaterThan(0);
		expect(head.offset).toBeLessThan(big.size);
		expect(await sha256OfFile(incomingPath(id))).toBe(await sha256OfFile(big.file, head.offset));

		const { probe, options } = resumeProbe();
		const resumed = await tusUpload(big.file, { cookie: conservator, endpoint: `${url2}/api/uploads/`, meta: meta('server-killed.tif'), uploadUrl: url, chunkSize: Infinity, ...options });
		expect(resumed.id).toBe(id);
		expect(probe.patchOffsets[0]).toBe(head.offset);
		expect(probe.accepted).toBe(big.size - head.offset);

		const photo = await recordedPhoto(id);
		expect(photo).toMatchObject({ sha256: big.sha, byteSize: big.size, width: 8200, height: 8200 });
	}, 120_000);
});

describe('two clients writing the same upload at once', () => {
	it('lets one PATCH win at an offset, refuses the other with 409, and stores none of the loser’s bytes', async () => {
		const url = await createUpload(conservator, mid.size, meta('two-writers.tif'));
		const id = url.split('/').pop()!;
		const head = await fsp.readFile(mid.file).then((b) => b.subarray(0, 4 * MiB));

		// Writer A sends the first 4 MiB of its PATCH and then stalls, holding the upload's lock.
		const a = rawPatch(url, 0, mid.size, conservator);
		a.req.write(head);
		await expect.poll(() => fs.statSync(incomingPath(id)).size, { timeout: 15_000, interval: 50 }).toBe(4 * MiB);

		// Writer B starts a PATCH at the same offset 0 with different bytes. It asks A to let go;
		// A stops after the drain time with what it has, and B then finds the offset moved on.
		// tus 1.0.0 §PATCH: "If the offsets do not match, the Server MUST respond with the
		// 409 Conflict status without modifying the upload resource."
		const b = rawPatch(url, 0, 8 * MiB, conservator);
		b.req.end(Buffer.alloc(8 * MiB, 0x5a));
		const rb = await b.response;
		expect('status' in rb && [409, 423].includes(rb.status), JSON.stringify(rb)).toBe(true);
		const ra = await a.response;
		a.req.destroy();
		// A's PATCH ends with 204 and the offset it reached, or its connection is closed (the
		// server sends "Connection: close" for a request it stopped reading).
		if ('status' in ra) expect(ra).toMatchObject({ status: 204, offset: String(4 * MiB) });

		const after = await tusHead(url, conservator);
		expect(after.offset).toBe(4 * MiB);
		expect(await sha256OfFile(incomingPath(id))).toBe(sha256(head));

		// Finishing with a real client from where the server says it is gives the file itself.
		const { probe, options } = resumeProbe();
		await tusUpload(mid.file, { cookie: conservator, meta: meta('two-writers.tif'), uploadUrl: url, ...options });
		expect(probe.patchOffsets[0]).toBe(4 * MiB);
		const photo = await recordedPhoto(id);
		expect(photo).toMatchObject({ sha256: mid.sha, byteSize: mid.size });
	}, 60_000);

	it('two tus clients racing on one upload URL with retries both finish, each byte accepted once, and the photo matches', async () => {
		const url = await createUpload(conservator, mid.size, meta('racing-clients.tif'));
		const id = url.split('/').pop()!;
		const seen = { accepted: 0, statuses: [] as number[] };
		const client = (delays: number[]) =>
			tusUpload(mid.file, {
				cookie: conservator,
				meta: meta('racing-clients.tif'),
				uploadUrl: url,
				// Small chunks so the two clients meet many times; they resolve conflicts the way
				// tus-js-client and Uppy do: a 409 or 423 is retried after a HEAD.
				chunkSize: 1 * MiB,
				retryDelays: delays,
				onChunkComplete: (chunk) => {
					seen.accepted += chunk;
				},
				onAfterResponse: (req, res) => {
					if (req.getMethod() === 'PATCH') seen.statuses.push(res.getStatus());
				},
			});
		const [one, two] = await Promise.all([client([0, 50, 100, 200, 300, 500, 800, 1000, 1500, 2000, 3000, 3000]), client([25, 75, 150, 250, 400, 600, 900, 1200, 1800, 2500, 3000, 3000])]);
		expect([one.id, two.id]).toEqual([id, id]);
		// Each 204 moved the offset on from where that PATCH said it started: had two PATCHes been
		// accepted at one offset, the bytes taken would add up to more than the file.
		expect(seen.accepted).toBe(mid.size);
		expect(seen.statuses.every((s) => [204, 409, 423].includes(s)), seen.statuses.join(',')).toBe(true);
		const photo = await recordedPhoto(id);
		expect(photo).toMatchObject({ sha256: mid.sha, byteSize: mid.size });
		expect(await Photo.count({ where: { uploadId: id } })).toBe(1);
	}, 60_000);
});

describe('the reconciler', () => {
	it('and the tus finish hook meeting on one upload: exactly one of them marks it finished, so it gets one job', async () => {
		const id = crypto.randomBytes(16).toString('hex');
		await PhotoUpload.create({ id, specimenId, checkId: null, view: 'back', stage: 'as-found', fileName: 'race.jpg', declaredType: 'image/jpeg', declaredSize: 100, clientSha256: null, uploaderId: conservatorId, refusalCode: null, reason: null, photoId: null, finishedAt: null });
		const outcomes = await Promise.all(Array.from({ length: 8 }, () => finishUpload(id)));
		expect(outcomes.filter((o) => o.ok && o.first)).toHaveLength(1);
		expect(outcomes.every((o) => o.ok)).toBe(true);
	});

	it('records bytes that are complete on disk but have no upload record, for the uploader tus kept', async () => {
		const bytes = await sampleJpeg(640, 480);
		const id = crypto.randomBytes(16).toString('hex');
		await placeIncoming(id, bytes, { filename: 'recovered.jpg', filetype: 'image/jpeg', specimenId, view: 'front', stage: 'as-found', uploaderId: conservatorId });

		// TESTPLAN F2 allows the reconciler 5 minutes; under a loaded CI machine its pass and the
		// ingest queue behind other tests' photos took over 30 s once, so wait up to 2 minutes here.
		const row = await waitForRecorded(id, 120_000);
		const photo = await Photo.findByPk(row.photoId!);
		expect(photo).toMatchObject({ uploadId: id, uploadedBy: conservatorId, specimenId, sha256: sha256(bytes), byteSize: bytes.length, fileName: 'recovered.jpg' });
		expect(row.uploaderId).toBe(conservatorId);
		expect(await AuditEvent.count({ where: { action: 'photo.upload-recovered', entityId: id, actorId: conservatorId } })).toBe(1);
		// The incoming copy is gone once the photo is recorded.
		expect(fs.existsSync(incomingPath(id))).toBe(false);
	}, 150_000);

	it.each([
		['with its tus info file', true],
		['without its tus info file', false],
	])('queues again a finished upload whose job was lost (%s)', async (_name, withInfo) => {
		const bytes = await sampleJpeg(480, 360);
		const id = crypto.randomBytes(16).toString('hex');
		// As onUploadFinish leaves it: finished, still "receiving", and no job (a queue emptied by a restore).
		await PhotoUpload.create({ id, specimenId, checkId: null, view: 'back', stage: 'as-found', fileName: 'lost-job.jpg', declaredType: 'image/jpeg', declaredSize: bytes.length, clientSha256: null, uploaderId: conservatorId, refusalCode: null, reason: null, photoId: null, finishedAt: new Date(Date.now() - 15 * 60_000) });
		await db().query(`UPDATE photo_uploads SET updated_at = now() - interval '15 minutes' WHERE id = :id`, { replacements: { id } });
		await placeIncoming(id, bytes, withInfo ? { filename: 'lost-job.jpg', filetype: 'image/jpeg', specimenId, view: 'back', stage: 'as-found', uploaderId: conservatorId } : null);

		const row = await waitForRecorded(id);
		expect(await Photo.findByPk(row.photoId!)).toMatchObject({ uploadId: id, uploadedBy: conservatorId, sha256: sha256(bytes) });
	}, 60_000);
});

describe('checks that can no longer change', () => {
	let reviewer: string;
	let specimen: string;

	beforeAll(async () => {
		reviewer = await cookieFor((await makeUser('reviewer', { tag: 'resume-r' })).user.id);
		specimen = await makeSpecimen(conservator, 'RESCHK');
	});

	/** A draft check with every part graded, ready to submit; its id and version. */
	async function gradedDraft(): Promise<{ id: string; version: number }> {
		const check = await openCheck(conservator, specimen);
		const saved = await call(`/api/checks/${check.id}`, { cookie: conservator, method: 'PUT', json: { version: check.version, check: checkBody } });
		expect(saved.status).toBe(200);
		return { id: check.id, version: (await saved.json()).check.version };
	}

	async function submit(check: { id: string; version: number }): Promise<number> {
		const s = await call(`/api/checks/${check.id}/submit`, { cookie: conservator, json: { version: check.version } });
		expect(s.status).toBe(200);
		const { check: after } = await s.json();
		expect(after.state).toBe('in-review');
		return after.version;
	}

	async function review(id: string, decision: 'approve' | 'return', comment = '') {
		const r = await call(`/api/checks/${id}/review`, { cookie: reviewer, json: { decision, comment } });
		expect(r.status).toBe(200);
		return (await r.json()).check as { state: string; version: number };
	}

	const checkMeta = (checkId: string, filename: string, filetype = 'image/tiff') => ({ filename, filetype, specimenId: specimen, checkId, view: 'front', stage: 'as-found' });

	it.each([
		['approved', /approved and cannot change/],
		['in-review', /waiting for review/],
	] as const)('refuses to create an upload for a check that is %s, with 409 and why', async (state, why) => {
		const check = await gradedDraft();
		await submit(check);
		if (state === 'approved') expect((await review(check.id, 'approve')).state).toBe('approved');
		const m = checkMeta(check.id, 'late.jpg', 'image/jpeg');
		const res = await call('/api/uploads/', { method: 'POST', cookie: conservator, headers: { 'tus-resumable': '1.0.0', 'upload-length': '1000', 'upload-metadata': tusMetadata(m) } });
		expect(res.status).toBe(409);
		expect(await res.text()).toMatch(why);
		expect(res.headers.get('location')).toBeNull();
		// A real client sees the same reason.
		await expect(tusUpload(await sampleJpeg(100, 100), { cookie: conservator, meta: m })).rejects.toThrow(why);
		expect(await PhotoUpload.count({ where: { checkId: check.id } })).toBe(0);
	});

	it('stops taking bytes for an upload begun on a draft once the check is submitted, and takes them again once it is returned', async () => {
		const check = await gradedDraft();
		const m = checkMeta(check.id, 'begun-on-draft.tif');
		const url = await createUpload(conservator, mid.size, m);
		const id = url.split('/').pop()!;
		const half = Math.floor(mid.size / 2);
		const part = rawPatch(url, 0, half, conservator);
		part.req.end((await fsp.readFile(mid.file)).subarray(0, half));
		expect(await part.response).toMatchObject({ status: 204, offset: String(half) });

		await submit(check);
		// A PATCH sent straight away is refused before its body is read: a 403, or the connection
		// closed under the client (tus closes it for a PATCH it stops reading).
		const early = rawPatch(url, half, mid.size - half, conservator);
		early.req.end((await fsp.readFile(mid.file)).subarray(half));
		const outcome = await early.response;
		if ('status' in outcome) expect(outcome.status).toBe(403);
		// A client resuming starts with HEAD (tus 1.0.0 §HEAD), which is refused too; tus-js-client
		// then tries to create a new upload and meets creation's refusal, with the reason.
		const head = await tusHead(url, conservator);
		expect(head.status).toBe(403);
		const refused = await tusUpload(mid.file, { cookie: conservator, meta: m, uploadUrl: url }).catch((err: Error) => err);
		expect(String(refused)).toMatch(/response code: 409.*waiting for review/s);
		// Nothing was added, and the upload is kept as it was, to be resumed if the check comes back.
		expect(await PhotoUpload.count({ where: { checkId: check.id } })).toBe(1);
		expect(await PhotoUpload.findByPk(id)).toMatchObject({ state: 'receiving', finishedAt: null });
		expect(fs.statSync(incomingPath(id)).size).toBe(half);
		await new Promise((r) => setTimeout(r, 3_500)); // a reconciler pass
		expect(await Photo.count({ where: { checkId: check.id } })).toBe(0);

		expect((await review(check.id, 'return', 'Add the back view, please.')).state).toBe('returned');
		expect((await tusHead(url, conservator)).offset).toBe(half);
		const { probe, options } = resumeProbe();
		await tusUpload(mid.file, { cookie: conservator, meta: m, uploadUrl: url, ...options });
		expect(probe.patchOffsets[0]).toBe(half);
		const photo = await recordedPhoto(id);
		expect(photo).toMatchObject({ sha256: mid.sha, byteSize: mid.size });
	}, 60_000);

	it('refuses, and does not keep, an upload whose last byte arrives after the check was submitted', async () => {
		const check = await gradedDraft();
		const url = await createUpload(conservator, mid.size, checkMeta(check.id, 'last-byte-late.tif'));
		const id = url.split('/').pop()!;
		const bytes = await fsp.readFile(mid.file);
		// One PATCH begun while the check is a draft; it stalls one byte short of the end.
		const patch = rawPatch(url, 0, mid.size, conservator);
		patch.req.write(bytes.subarray(0, mid.size - 1));
		await expect.poll(() => fs.statSync(incomingPath(id)).size, { timeout: 15_000, interval: 50 }).toBe(mid.size - 1);
		await submit(check);
		patch.req.end(bytes.subarray(mid.size - 1));
		const outcome = await patch.response;
		expect(outcome).toMatchObject({ status: 403 });

		const row = await PhotoUpload.findByPk(id);
		expect(row).toMatchObject({ state: 'refused', refusalCode: 'check-closed', finishedAt: null });
		expect(row!.reason).toMatch(/waiting for review.*not kept/);
		expect(fs.existsSync(incomingPath(id))).toBe(false);
		const s = await settled(conservator, id);
		expect(s).toMatchObject({ state: 'refused', code: 'check-closed', photoId: null });
		expect(await Photo.count({ where: { checkId: check.id } })).toBe(0);
	}, 60_000);

	it('has the reconciler refuse complete bytes that were never marked finished, once their check is approved', async () => {
		const check = await gradedDraft();
		const bytes = await sampleJpeg(320, 240);
		const id = crypto.randomBytes(16).toString('hex');
		// What a crash between the last byte and the database leaves: a record still receiving.
		await PhotoUpload.create({ id, specimenId: specimen, checkId: check.id, view: 'front', stage: 'as-found', fileName: 'crashed.jpg', declaredType: 'image/jpeg', declaredSize: bytes.length, clientSha256: null, uploaderId: conservatorId, refusalCode: null, reason: null, photoId: null, finishedAt: null });
		await submit(check);
		await review(check.id, 'approve');
		await placeIncoming(id, bytes, { ...checkMeta(check.id, 'crashed.jpg', 'image/jpeg'), uploaderId: conservatorId });

		const row = await waitForSettledRow(id);
		expect(row).toMatchObject({ state: 'refused', refusalCode: 'check-closed' });
		expect(row.reason).toMatch(/approved and cannot change/);
		expect(fs.existsSync(incomingPath(id))).toBe(false);
		expect(await Photo.count({ where: { checkId: check.id } })).toBe(0);
	}, 60_000);
});

const checkBody = {
	checkedOn: '2026-11-20',
	reason: 'routine-survey',
	parts: Object.fromEntries(['container', 'lid', 'seal', 'fluid', 'specimen', 'mount', 'label'].map((p) => [p, { grade: 'good', terms: [], note: '' }])),
	priority: 'routine',
	notes: '',
	fluid: { readingPercentVol: 70, tempC: 20, glass: 'soda-lime', formaldehyde: 'not-tested', pH: null, levelMm: 140, method: 'meter' },
};

const incomingPath = (id: string) => path.join(inject('uploadsDir'), 'incoming', id);

/**
 * HEAD once the server has finished with the interrupted PATCH: the offset no longer grows (the
 * server may still be writing what reached its socket before the client went away).
 */
async function waitForSettledHead(url: string) {
	let last = await tusHead(url, conservator);
	for (let i = 0; i < 50; i++) {
		await new Promise((r) => setTimeout(r, 100));
		const next = await tusHead(url, conservator);
		if (next.offset === last.offset) return next;
		last = next;
	}
	return last;
}

/** Puts bytes (and tus's info file, when given) into incoming/ as FileStore leaves them, each appearing whole. */
async function placeIncoming(id: string, bytes: Buffer, metadata: Record<string, string> | null): Promise<void> {
	const dir = path.join(inject('uploadsDir'), 'incoming');
	await fsp.mkdir(dir, { recursive: true });
	const file = path.join(dir, id);
	// Temporary names are not upload ids, so the reconciler never sees a half-written file.
	await fsp.writeFile(`${file}.tmp`, bytes);
	await fsp.rename(`${file}.tmp`, file);
	if (metadata) {
		const info = { id, size: bytes.length, offset: 0, metadata, creation_date: new Date().toISOString() };
		await fsp.writeFile(`${file}.json.tmp`, JSON.stringify(info));
		await fsp.rename(`${file}.json.tmp`, `${file}.json`);
	}
}

/** Polls the database until the worker is done with the upload (the reconciler runs every 3 s in tests). */
async function waitForSettledRow(id: string, ms = 30_000): Promise<PhotoUpload> {
	const until = Date.now() + ms;
	while (Date.now() < until) {
		const row = await PhotoUpload.findByPk(id);
		if (row && row.state !== 'receiving' && row.state !== 'processing') return row;
		await new Promise((r) => setTimeout(r, 200));
	}
	throw new Error(`upload ${id} was not settled within ${ms} ms`);
}

async function waitForRecorded(id: string, ms?: number): Promise<PhotoUpload> {
	const row = await waitForSettledRow(id, ms);
	expect(row, `${row.state}: ${row.reason}`).toMatchObject({ state: 'recorded' });
	return row;
}
