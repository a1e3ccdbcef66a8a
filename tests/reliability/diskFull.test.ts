import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import type { DetailedError } from 'tus-js-client';
import { afterAll, afterEach, beforeAll, describe, expect, inject, it } from 'vitest';
import { signedInUser } from '../helpers/users.ts';
import { makeSpecimen, sampleJpeg, settled, sha256OfFile, tusHead, tusMetadata, tusStart, tusUpload, uploadIdOf, writeTiff } from '../helpers/photos.ts';
import { startOwnStack, type OwnStack } from '../helpers/ownStack.ts';
import { checkStoredPhotos } from '../helpers/photoFiles.ts';
import { fill, freeBytes, mountTmpfs, unfill, unmountTmpfs } from '../helpers/tmpfs.ts';
import { db } from '../../src/lib/server/db.ts';
import { photoIdFor } from '../../src/lib/server/photos/ingest.ts';

/**
 * TESTPLAN F7, disk full (ASVS 5.0 16.5.3, fail securely: a failure leaves nothing half done). The
 * whole uploads folder is a small tmpfs mounted by the test: it must be one filesystem, because
 * masters are hard-linked from incoming/ and derivative sets renamed from work/. An app and a photo
 * worker of the test's own use it, on a database of their own (so the global worker takes none of
 * their jobs) that stays on the real disk. Pass: the uploader is told the server is out of space
 * (a 507, not a dropped connection); nothing is marked complete, no photo row is written, no
 * half-made derivative set is left; photos recorded earlier keep their files, hashes unchanged;
 * once space is back the upload resumes where it stopped and the job is retried, and both photos
 * are recorded with the right hash.
 */
const TMPFS_MIB = 40;
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'meniscus-f7-'));
const uploads = path.join(tmp, 'uploads');
let stack: OwnStack | undefined;
let cookie = '';
let specimenId = '';
let endpoint = '';
const started = Date.now();

const meta = (filename: string) => ({ filename, filetype: 'image/tiff', specimenId, view: 'front', stage: 'as-found' });
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

beforeAll(async () => {
	// As root, the postgres OS user never needs this folder, but the app and worker (root too) do.
	fs.chmodSync(tmp, 0o755);
	mountTmpfs(uploads, TMPFS_MIB);
	stack = await startOwnStack('f7', uploads);
	stack.startWorker();
	endpoint = `${stack.base}/api/uploads/`;
	({ cookie } = await signedInUser('conservator', 'f7'));
	specimenId = await makeSpecimen(cookie, 'F7', stack.base);
}, 180_000);

afterAll(async () => {
	await stack?.stop().catch((err) => console.error(`[F7] stopping the stack: ${err.message}`));
	unmountTmpfs(uploads);
	fs.rmSync(tmp, { recursive: true, force: true });
	console.log(`[F7] file took ${((Date.now() - started) / 1000).toFixed(1)} s`);
});

// A failed check must not leave the disk full for the next one.
afterEach(() => unfill(uploads));

async function uploadRow(id: string) {
	const [row] = await db().query<{ state: string; finished: boolean; photo_id: string | null; photos: number; derivatives: number }>(
		`SELECT u.state, u.finished_at IS NOT NULL AS finished, u.photo_id,
		        (SELECT count(*)::int FROM photos p WHERE p.upload_id = u.id) AS photos,
		        (SELECT count(*)::int FROM photo_derivatives d JOIN photos p ON p.id = d.photo_id WHERE p.upload_id = u.id) AS derivatives
		 FROM photo_uploads u WHERE u.id = :id`,
		{ replacements: { id }, type: QueryTypes.SELECT },
	);
	return row;
}

/** The earlier photos, as the database and the disk have them: must come through unchanged. */
async function expectStoredIntact(photos: number) {
	const stored = await checkStoredPhotos(stack!.databaseUrl, uploads);
	expect(stored.problems).toEqual([]);
	expect(stored.photos).toBe(photos);
}

describe('the uploads folder runs out of space (TESTPLAN F7)', () => {
	it('keeps the database off the small filesystem (records stay consistent whatever the disk does)', () => {
		expect(fs.statSync(inject('clusterDataDir')).dev).not.toBe(fs.statSync(uploads).dev);
	});

	it('stops an upload with a 507 when the disk fills mid-PATCH, marks nothing complete, and resumes once space is back', async () => {
		const earlier = await tusUpload(await sampleJpeg(1200, 900), { cookie, meta: { ...meta('earlier.jpg'), filetype: 'image/jpeg' }, endpoint });
		expect((await settled(cookie, earlier.id, 90_000, stack!.base)).state).toBe('recorded');
		await expectStoredIntact(1);

		const file = path.join(tmp, 'jar-a.tif');
		const size = await writeTiff(file, 1400, 1000);
		fill(uploads, 1024 * 1024);
		const free = freeBytes(uploads);
		const first = tusStart(file, { cookie, meta: meta('jar-a.tif'), endpoint });
		const failure = (await first.done.then(() => null, (err: DetailedError) => err))!;
		const url = new URL(first.upload.url!, stack!.base).href;
		const id = uploadIdOf(url);
		const status = failure?.originalResponse?.getStatus();
		const body = failure?.originalResponse?.getBody() ?? '';
		const head = await tusHead(url, cookie);
		console.log(`[F7 upload] ${(size / 1048576).toFixed(1)} MiB into ${(free / 1024).toFixed(0)} KiB free: ${status} "${body.trim()}"; HEAD offset ${head.offset}${status ? '' : `; client error: ${failure?.message}`}`);
		// The client is told why (a status and a message), not left with a dropped connection.
		expect(failure).not.toBeNull();
		expect(status).toBe(507);
		expect(body).toMatch(/out of storage space/i);
		// What reached the disk is kept and offered for resuming (tus 1.0.0 §HEAD); nothing is complete.
		expect(head.status).toBe(200);
		expect(head.offset).toBeGreaterThan(0);
		expect(head.offset).toBeLessThan(size);
		expect(await uploadRow(id)).toEqual({ state: 'receiving', finished: false, photo_id: null, photos: 0, derivatives: 0 });
		await expectStoredIntact(1);

		unfill(uploads);
		const offsets: number[] = [];
		await tusUpload(file, { cookie, meta: meta('jar-a.tif'), endpoint, uploadUrl: url, onBeforeRequest: (r) => void (r.getMethod() === 'PATCH' && offsets.push(Number(r.getHeader('Upload-Offset')))) });
		// Resumed from the offset the server kept, not from the start (tus 1.0.0 §Core Protocol).
		expect(offsets[0]).toBe(head.offset);
		const done = await settled(cookie, id, 120_000, stack!.base);
		expect(done.state).toBe('recorded');
		const [photo] = await db().query<{ sha256: string }>(`SELECT sha256 FROM photos WHERE upload_id = :id`, { replacements: { id }, type: QueryTypes.SELECT });
		expect(photo!.sha256).toBe(await sha256OfFile(file));
		await expectStoredIntact(2);
	}, 300_000);

	it('fails the job cleanly when the disk fills while derivatives are made, keeps the upload, and records it once space is back', async () => {
		// The worker waits while the bytes arrive, so the disk fills after the upload and before the job.
		await stack!.stopWorker();
		const file = path.join(tmp, 'jar-b.tif');
		await writeTiff(file, 1300, 1000);
		const { id } = await tusUpload(file, { cookie, meta: meta('jar-b.tif'), endpoint });
		const incoming = path.join(uploads, 'incoming', id);
		const sha = await sha256OfFile(file);
		// Full to the last page: every derivative write fails, the JPEG encoder's included.
		fill(uploads, 0);
		stack!.startWorker();
		// pg-boss's own record of the job: failed once and waiting to be retried.
		let job: { state: string; retry_count: number; output: unknown } | undefined;
		const until = Date.now() + 120_000;
		while (Date.now() < until && !['retry', 'completed', 'failed'].includes(job?.state ?? '')) {
			await sleep(500);
			[job] = await db().query<typeof job & object>(`SELECT state, retry_count, output FROM pgboss.job WHERE name = 'photo-ingest' AND data->>'uploadId' = :id ORDER BY created_on DESC LIMIT 1`, { replacements: { id }, type: QueryTypes.SELECT });
		}
		console.log(`[F7 worker] job ${job?.state} (retries so far ${job?.retry_count}): ${JSON.stringify(job?.output).slice(0, 300)}; worker: ${stack!.workerLog.filter((l) => l.includes(id)).join(' | ').slice(0, 400)}`);
		expect(job?.state).toBe('retry');
		expect(JSON.stringify(job?.output)).toMatch(/space|ENOSPC/i);
		// Not refused, not recorded: waiting for another try, with its bytes where they were.
		expect(await uploadRow(id)).toEqual({ state: 'receiving', finished: true, photo_id: null, photos: 0, derivatives: 0 });
		expect(await sha256OfFile(incoming)).toBe(sha);
		// No half-made derivative set anywhere, and no master placed for it.
		expect(fs.readdirSync(path.join(uploads, 'work'))).toEqual([]);
		const sets = path.join(uploads, 'derivatives', photoIdFor(id));
		expect(fs.existsSync(sets) ? fs.readdirSync(sets) : []).toEqual([]);
		await expectStoredIntact(2);
		// A new upload cannot even be created on the full disk: 507 too, and no half-written info file.
		const before = fs.readdirSync(path.join(uploads, 'incoming')).sort();
		const created = await fetch(endpoint, { method: 'POST', headers: { cookie, origin: stack!.base, 'tus-resumable': '1.0.0', 'upload-length': '1000', 'upload-metadata': tusMetadata(meta('jar-c.tif')) } });
		expect([created.status, await created.text()]).toEqual([507, expect.stringMatching(/out of storage space/i)]);
		expect(fs.readdirSync(path.join(uploads, 'incoming')).sort()).toEqual(before);

		unfill(uploads);
		const done = await settled(cookie, id, 180_000, stack!.base);
		expect(done.state).toBe('recorded');
		const [photo] = await db().query<{ sha256: string }>(`SELECT sha256 FROM photos WHERE upload_id = :id`, { replacements: { id }, type: QueryTypes.SELECT });
		expect(photo!.sha256).toBe(sha);
		await expectStoredIntact(3);
	}, 300_000);
});
