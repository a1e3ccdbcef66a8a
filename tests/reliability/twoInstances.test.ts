import fs from 'node:fs';
import fsp from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { freePort } from '../../db/cluster.mjs';
import { stopService, type Service } from '../../scripts/lib/proc.mjs';
import { startApp } from '../helpers/apps.ts';
import { lockHolders } from '../helpers/locks.ts';
import { makeSpecimen, settled, sha256, sha256OfFile, tusHead, tusUpload, uploadIdOf, writeTiff } from '../helpers/photos.ts';
import { startRoundRobin } from '../helpers/roundRobin.ts';
import { useTestDatabase } from '../helpers/server.ts';
import { createUpload, rawPatch, type RawOutcome } from '../helpers/tusRaw.ts';
import { cookieFor, makeUser } from '../helpers/users.ts';
import { db } from '../../src/lib/server/db.ts';
import { Photo } from '../../src/lib/server/models/index.ts';

/**
 * TESTPLAN F4 (tus-node-server issue #408): two app processes of our own on one database and one
 * uploads folder, behind a round-robin proxy without sticky sessions, as a load balancer would put
 * them. @tus/server's default MemoryLocker locks per process, so two PATCHes of one upload on two
 * processes could both be accepted and interleave their bytes; the app's locks are held in
 * PostgreSQL instead (src/lib/server/photos/pgLocker.ts). Pass: chunks served by both instances
 * make the exact file; of two PATCHes at one offset with different bytes sent to the two instances
 * at once exactly one is accepted (tus 1.0.0 §PATCH: a mismatched offset gets 409 "without modifying
 * the upload resource"), the stored bytes are exactly the winner's, and the upload then completes
 * with its hash; a request on one instance makes the holder on the other let go (MemoryLocker's
 * requestRelease, across processes); a lock held by a process killed with SIGKILL is released (a
 * session-level advisory lock ends with its connection: PostgreSQL docs §13.3.5).
 */
const KiB = 1024;
const MiB = 1024 * KiB;
/** Races at one offset; each is a fresh upload, so the chance of meeting a real overlap adds up. */
const ROUNDS = 6;
const RACE_CHUNK = 1 * MiB;
let tmp = '';
let cookie = '';
let specimenId = '';
let proxy: Awaited<ReturnType<typeof startRoundRobin>>;
let appA: Service | undefined;
let appB: Service | undefined;
let urlA = '';
let urlB = '';
let portB = 0;
/** ~5.9 MB for the round-robin upload, and pairs of ~1.5 MB files of one size with different bytes. */
const big = { file: '', sha: '' };
const pairs: { file: string; bytes: Buffer }[][] = [];

const meta = (filename: string) => ({ filename, filetype: 'image/tiff', specimenId, view: 'front', stage: 'as-found' });
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const incomingPath = (id: string) => path.join(inject('uploadsDir'), 'incoming', id);
const on = (base: string, url: string) => base + new URL(url).pathname;

beforeAll(async () => {
	useTestDatabase();
	db();
	tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'meniscus-two-instances-'));
	const { user } = await makeUser('conservator', { tag: 'two-instances' });
	cookie = await cookieFor(user.id);
	specimenId = await makeSpecimen(cookie, 'TWO');
	big.file = path.join(tmp, 'big.tif');
	await writeTiff(big.file, 1400, 1400);
	big.sha = await sha256OfFile(big.file);
	for (let i = 0; i < ROUNDS + 2; i++) {
		// writeTiff draws fresh noise each time: same size and header, different pixels.
		const pair = [];
		for (const side of ['x', 'y']) {
			const file = path.join(tmp, `race-${i}-${side}.tif`);
			await writeTiff(file, 700, 700);
			pair.push({ file, bytes: await fsp.readFile(file) });
		}
		pairs.push(pair);
	}
	const [pa, pb] = [await freePort(), await freePort()];
	urlA = `http://127.0.0.1:${pa}`;
	urlB = `http://127.0.0.1:${pb}`;
	portB = pb;
	proxy = await startRoundRobin([urlA, urlB]);
	// Both behind the proxy's address, as the site's public address.
	[appA, appB] = await Promise.all([startApp('app-a', pa, proxy.url), startApp('app-b', pb, proxy.url)]);
}, 180_000);

afterAll(async () => {
	await Promise.all([stopService(appA), stopService(appB)]);
	await proxy?.close();
	if (tmp) fs.rmSync(tmp, { recursive: true, force: true });
});

/** The SHA-256 of the master the worker recorded for an upload. */
async function recordedSha(id: string): Promise<string> {
	const s = await settled(cookie, id, 120_000);
	expect(s, JSON.stringify(s)).toMatchObject({ state: 'recorded' });
	return (await Photo.findByPk(s.photoId!))!.sha256;
}

/** A PATCH on `base` that sends `head` bytes and then waits, holding the upload's lock. */
async function stalledPatch(base: string, url: string, file: { bytes: Buffer }, head: number) {
	const p = rawPatch(on(base, url), 0, file.bytes.length, cookie);
	p.req.write(file.bytes.subarray(0, head));
	await expect.poll(() => fs.statSync(incomingPath(uploadIdOf(url))).size, { timeout: 15_000, interval: 50 }).toBe(head);
	return p;
}

describe('two app processes behind one round-robin address (TESTPLAN F4)', () => {
	it('takes an upload whose chunks alternate between the instances, and records exactly the file', async () => {
		const first = proxy.served.length;
		const { id } = await tusUpload(big.file, { cookie, meta: meta('round-robin.tif'), endpoint: `${proxy.url}/api/uploads/`, chunkSize: 1 * MiB });
		const patches = proxy.served.slice(first).filter((s) => s.method === 'PATCH');
		console.log(`[F4 round-robin] PATCHes by instance: ${JSON.stringify(Object.fromEntries([urlA, urlB].map((u) => [u, patches.filter((p) => p.target === u).length])))}`);
		expect(new Set(patches.map((p) => p.target))).toEqual(new Set([urlA, urlB]));
		expect(patches.every((p) => p.status === 204)).toBe(true);
		expect(await recordedSha(id)).toBe(big.sha);
	}, 180_000);

	it('accepts exactly one of two PATCHes at one offset sent to the two instances at once, keeps only its bytes, and completes with its hash', async () => {
		const outcomes: string[] = [];
		const finished: Promise<void>[] = [];
		for (let round = 0; round < ROUNDS; round++) {
			const [x, y] = pairs[round]!;
			const url = await createUpload(cookie, x!.bytes.length, meta(`race-${round}.tif`), proxy.url);
			const id = uploadIdOf(url);
			const a = rawPatch(on(urlA, url), 0, RACE_CHUNK, cookie);
			const b = rawPatch(on(urlB, url), 0, RACE_CHUNK, cookie);
			// Both requests' headers first, their bodies together a moment later: each server has the
			// request in hand while the upload is still at offset 0, so without a lock shared between
			// them both would pass tus's offset check and write. Measured once with the default
			// MemoryLocker: 12 rounds out of 12 answered 204/204, 7 of them with the two bodies' bytes mixed.
			a.req.flushHeaders();
			b.req.flushHeaders();
			await sleep(300);
			a.req.end(x!.bytes.subarray(0, RACE_CHUNK));
			b.req.end(y!.bytes.subarray(0, RACE_CHUNK));
			const [ra, rb] = await Promise.all([a.response, b.response]);
			const status = (r: RawOutcome) => ('status' in r ? r.status : 0);
			outcomes.push(`${status(ra)}/${status(rb)}`);
			const accepted = [ra, rb].filter((r) => status(r) === 204);
			expect(accepted, `round ${round}: ${JSON.stringify([ra, rb])}`).toHaveLength(1);
			const loser = status(ra) === 204 ? rb : ra;
			expect([409, 423], `round ${round}: ${JSON.stringify(loser)}`).toContain(status(loser));
			const winner = status(ra) === 204 ? x! : y!;
			expect(accepted[0]).toMatchObject({ offset: String(RACE_CHUNK) });
			// The upload holds the winner's bytes and nothing else: no byte of the loser interleaved.
			expect((await tusHead(on(urlA, url), cookie)).offset).toBe(RACE_CHUNK);
			expect(await sha256OfFile(incomingPath(id))).toBe(sha256(winner.bytes.subarray(0, RACE_CHUNK)));
			// The winner's client finishes through the proxy (both instances again); the photo is its file.
			await tusUpload(winner.file, { cookie, meta: meta(`race-${round}.tif`), uploadUrl: url, endpoint: `${proxy.url}/api/uploads/`, chunkSize: 256 * KiB });
			finished.push(recordedSha(id).then((sha) => expect(sha).toBe(sha256(winner.bytes))));
		}
		console.log(`[F4 race] instance A/B answers per round: ${outcomes.join(', ')}`);
		await Promise.all(finished);
	}, 240_000);

	it('makes a PATCH stalled on one instance let go when the other instance asks for its lock', async () => {
		const [file] = pairs[ROUNDS]!;
		const url = await createUpload(cookie, file!.bytes.length, meta('let-go.tif'), proxy.url);
		const p = await stalledPatch(urlB, url, file!, 512 * KiB);
		// A HEAD takes the lock too (@tus/server HeadHandler); on A it must wait for B to let go,
		// which B does lockDrainTimeout (3 s) after A's NOTIFY reaches it. With per-process locks A
		// would answer at once while B could still write.
		const t0 = Date.now();
		const head = await tusHead(on(urlA, url), cookie);
		const waited = Date.now() - t0;
		console.log(`[F4 release] HEAD on A answered after ${waited} ms (B let go lockDrainTimeout after A asked)`);
		expect(head).toMatchObject({ status: 200, offset: 512 * KiB });
		expect(waited).toBeGreaterThanOrEqual(2_000);
		// B's PATCH ended although its body was never finished: 204 at what it took, or closed.
		const outcome = await p.response;
		p.req.destroy();
		if ('status' in outcome) expect(outcome).toMatchObject({ status: 204, offset: String(512 * KiB) });
		const { id } = await tusUpload(file!.file, { cookie, meta: meta('let-go.tif'), uploadUrl: on(urlA, url), endpoint: `${urlA}/api/uploads/` });
		expect(await recordedSha(id)).toBe(sha256(file!.bytes));
	}, 120_000);

	it('releases the lock of an instance killed with SIGKILL, so the other one takes the upload over', async () => {
		const [file] = pairs[ROUNDS + 1]!;
		const url = await createUpload(cookie, file!.bytes.length, meta('holder-killed.tif'), proxy.url);
		const id = uploadIdOf(url);
		const p = await stalledPatch(urlB, url, file!, 512 * KiB);
		expect(await lockHolders(id)).toHaveLength(1);
		appB!.kill('SIGKILL');
		expect(await appB!.exited).toMatchObject({ signal: 'SIGKILL' });
		await p.response;
		const t0 = Date.now();
		await expect.poll(() => lockHolders(id), { timeout: 15_000, interval: 50 }).toEqual([]);
		console.log(`[F4 kill] the killed instance's lock was gone ${Date.now() - t0} ms after it exited`);
		const head = await tusHead(on(urlA, url), cookie);
		expect(head).toMatchObject({ status: 200, offset: 512 * KiB });
		const { probe, done } = resumeOn(urlA, url, file!.file);
		await done;
		expect(probe.firstOffset).toBe(512 * KiB);
		expect(await recordedSha(id)).toBe(sha256(file!.bytes));
		// B comes back for afterAll's tidy stop, and serves again.
		appB = await startApp('app-b', portB, proxy.url);
	}, 120_000);
});

/** Resumes an upload on one instance, noting the offset of its first PATCH. */
function resumeOn(base: string, url: string, file: string) {
	const probe = { firstOffset: undefined as number | undefined };
	const done = tusUpload(file, {
		cookie,
		meta: meta(path.basename(file)),
		uploadUrl: on(base, url),
		endpoint: `${base}/api/uploads/`,
		onBeforeRequest: (req) => {
			if (req.getMethod() === 'PATCH') probe.firstOffset ??= Number(req.getHeader('Upload-Offset'));
		},
	});
	return { probe, done };
}
