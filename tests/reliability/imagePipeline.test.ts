import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Result } from 'autocannon';
import { QueryTypes } from 'sequelize';
import { call, useTestDatabase } from '../helpers/server.ts';
import { signedInUser } from '../helpers/users.ts';
import { newSpecimen } from '../helpers/checks.ts';
import { openCheck, sha256OfFile, tusUpload, type UploadStatusBody } from '../helpers/photos.ts';
import { numberedImages, type TestImage } from '../helpers/testImages.ts';
import { latencyLine, readLoad, readPaths } from '../helpers/readLoad.ts';
import { cpuSeconds, mib, processTree, threadNice, treeMemory } from '../helpers/procStats.ts';
import { db } from '../../src/lib/server/db.ts';
import { config } from '../../src/lib/server/config.ts';
import { INGEST_QUEUE } from '../../src/lib/server/photos/queue.ts';
import { resolveStored } from '../../src/lib/server/photos/storage.ts';

/**
 * TESTPLAN L2, the image pipeline (ASVS 5.0 15.2.2, bound costly functions; sharp's docs on
 * concurrency(), cache() and limitInputPixels): 30 different invented 60-MP JPEGs (9504 × 6336, the
 * photo benchmark's picture, each numbered with a drawn patch) are uploaded over tus at once, onto
 * open condition checks of specimens made here, and prepared by the suite's one photo worker.
 * Checked while they are processed, every 250 ms: the ingest jobs the worker has taken (pg-boss's
 * `active` jobs, and uploads in `processing`) never exceed the configured concurrency, the rest
 * wait in the database; the worker's and the app's resident memory stay under budget; the app's
 * signed-in reads keep their p99 within 2× of the same run's baseline (or under a floor). Then every
 * upload is recorded with the SHA-256 of its file, and no job failed or was retried.
 */
const COUNT = 30;
const SECONDS = Number(process.env.MENISCUS_L2_SECONDS ?? 20);
const READERS = 10;
const SAMPLE_MS = 250;
/** Generous: 30 s a photograph on a loaded 2-core machine (about 3 s each when it is quiet). */
const SETTLE_MS = COUNT * 30_000;
/**
 * Budgets. The worker decodes one 60-MP photo at a time into a 9504 × 6336 × 3 raster (181 MB);
 * bench/REPORT.md ("Photo ingest") measured 373–381 MB peak RSS for the whole pipeline on that
 * image in a bare process. 1.5 GiB leaves room for Node, Sequelize and pg-boss beside it and for
 * allocator slack, and is still well under what a second decode at once or memory kept from one
 * photo to the next (30 × 181 MB) would take. The app only streams tus bytes to disk: 512 MiB.
 */
const WORKER_BUDGET = 1.5 * 1024 ** 3;
const APP_BUDGET = 512 * 1024 ** 2;
/** TESTPLAN L2: p99 while the worker is busy ≤ 2× the baseline p99... */
const P99_RATIO = 2;
/** ...or under 100 ms, where a doubling is noise on 2 shared cores (common practice, no published source). */
const P99_FLOOR_MS = 100;

let cookie = '';
let paths: string[] = [];
let images: TestImage[] = [];
const targets: { specimenId: string; checkId: string }[] = [];
const imageDir = fs.mkdtempSync(path.join(os.tmpdir(), 'meniscus-l2-images-'));

interface Sample {
	at: number;
	/** Ingest jobs pg-boss has marked active (fetched by a worker, completion not yet written). */
	active: number;
	/** Of those, the ones whose upload is not yet settled: the work a worker really has in hand. */
	inHand: number;
	waiting: number;
	processing: number;
	/** Uploads recorded since the run began. */
	recorded: number;
	workerRss: number;
	appRss: number;
}

beforeAll(async () => {
	useTestDatabase();
	({ cookie } = await signedInUser('conservator', 'pipeline'));
	paths = await readPaths(cookie);
	for (let i = 0; i < COUNT; i++) {
		const { id } = await newSpecimen(cookie, `L2${process.pid}`);
		targets.push({ specimenId: id, checkId: (await openCheck(cookie, id)).id });
	}
	const t = Date.now();
	images = await numberedImages(imageDir, '60 MP', COUNT);
	console.log(`[L2 images] ${COUNT} different ${images[0]!.width} × ${images[0]!.height} JPEGs (${(images.reduce((n, i) => n + i.bytes, 0) / 1e6).toFixed(0)} MB) made in ${((Date.now() - t) / 1000).toFixed(1)} s`);
}, 600_000);

afterAll(() => fs.rmSync(imageDir, { recursive: true, force: true }));

type QueueState = Omit<Sample, 'at' | 'workerRss' | 'appRss'>;

/** The ingest queue as the database holds it, and the uploads a worker has claimed. */
async function queueNow(since = new Date()): Promise<QueueState> {
	const [row] = await db().query<QueueState>(
		`SELECT (SELECT count(*) FROM pgboss.job WHERE name = :q AND state = 'active')::int AS active,
		        (SELECT count(*) FROM pgboss.job j JOIN photo_uploads u ON u.id = j.data->>'uploadId'
		          WHERE j.name = :q AND j.state = 'active' AND u.state IN ('receiving', 'processing'))::int AS "inHand",
		        (SELECT count(*) FROM pgboss.job WHERE name = :q AND state IN ('created', 'retry'))::int AS waiting,
		        (SELECT count(*) FROM photo_uploads WHERE state = 'processing')::int AS processing,
		        (SELECT count(*) FROM photo_uploads WHERE state = 'recorded' AND updated_at >= :since)::int AS recorded`,
		{ replacements: { q: INGEST_QUEUE, since }, type: QueryTypes.SELECT },
	);
	return row!;
}

const p99Passes = (during: Result, base: Result) => during.latency.p99 <= P99_RATIO * base.latency.p99 || during.latency.p99 < P99_FLOOR_MS;

describe('image pipeline (TESTPLAN L2)', () => {
	it(`takes ${COUNT} × 60-MP uploads at once with a bounded queue, memory under budget and other routes served`, async () => {
		const concurrency = config().MENISCUS_PHOTO_JOBS;
		const pids = inject('servicePids');
		const workerTree = processTree(pids.worker);
		const appTree = processTree(pids.app);
		const before = { worker: treeMemory(workerTree), app: treeMemory(appTree) };
		console.log(`[L2 memory before] worker ${mib(before.worker.rss)} (peak so far ${mib(before.worker.hwm)}, ${workerTree.length} processes), app ${mib(before.app.rss)} (peak so far ${mib(before.app.hwm)})`);

		// Baseline: the same reads, same connections, same run, with the worker idle.
		expect((await queueNow()).active).toBe(0);
		const baseline = await readLoad(cookie, paths, { connections: READERS, seconds: SECONDS });
		console.log(latencyLine('L2 reads, baseline', baseline));

		const samples: Sample[] = [];
		const t0 = Date.now();
		const since = new Date(t0);
		let sampling = true;
		const sampler = (async () => {
			while (sampling) {
				const q = await queueNow(since);
				samples.push({ at: Date.now() - t0, ...q, workerRss: treeMemory(workerTree).rss, appRss: treeMemory(appTree).rss });
				await new Promise((r) => setTimeout(r, SAMPLE_MS));
			}
		})();

		// All 30 at once: they finish together, so the queue fills faster than one worker empties it.
		const uploads = await Promise.all(
			images.map(async (img, i) => {
				const meta = { filename: `l2-${i + 1}.jpg`, filetype: 'image/jpeg', specimenId: targets[i]!.specimenId, checkId: targets[i]!.checkId, view: 'front', stage: 'as-found' };
				const { id } = await tusUpload(img.file, { cookie, meta, chunkSize: 8 * 1024 * 1024 });
				return { id, img };
			}),
		);
		const uploaded = Date.now() - t0;
		console.log(`[L2 uploads] ${COUNT} tus uploads finished in ${(uploaded / 1000).toFixed(1)} s`);

		// The reads again while the worker works through the queue.
		const duringStart = Date.now() - t0;
		const cpuBefore = { worker: cpuSeconds(workerTree), app: cpuSeconds(appTree) };
		const during = await readLoad(cookie, paths, { connections: READERS, seconds: SECONDS });
		const duringEnd = Date.now() - t0;
		const cores = (pids: number[], before: number) => (cpuSeconds(pids) - before) / ((duringEnd - duringStart) / 1000);
		const busyCores = { worker: cores(workerTree, cpuBefore.worker), app: cores(appTree, cpuBefore.app) };
		const left = await queueNow();
		console.log(latencyLine('L2 reads, worker busy', during));

		// Everything settles, read from the database so no poller loads the app being measured.
		const ids = uploads.map((u) => u.id);
		const until = Date.now() + SETTLE_MS;
		let states: { id: string; state: string }[] = [];
		while (Date.now() < until) {
			states = await db().query<{ id: string; state: string }>(`SELECT id, state FROM photo_uploads WHERE id IN (:ids)`, { replacements: { ids }, type: QueryTypes.SELECT });
			if (states.length === COUNT && states.every((s) => ['recorded', 'refused', 'quarantined'].includes(s.state))) break;
			await new Promise((r) => setTimeout(r, 1000));
		}
		const settledAt = Date.now() - t0;
		sampling = false;
		await sampler;
		const after = { worker: treeMemory(workerTree), app: treeMemory(appTree) };

		// What the run saw.
		const max = (f: (s: Sample) => number) => Math.max(...samples.map(f));
		const busy = samples.filter((s) => s.at >= duringStart && s.at <= duringEnd);
		const ratio = during.latency.p99 / Math.max(1, baseline.latency.p99);
		console.log(`[L2 queue] ${samples.length} samples every ${SAMPLE_MS} ms: jobs in hand at most ${max((s) => s.inHand)} (concurrency ${concurrency}), active in pg-boss at most ${max((s) => s.active)}, uploads processing at most ${max((s) => s.processing)}, waiting in the database at most ${max((s) => s.waiting)}; ${left.active + left.waiting} still queued when the busy reads ended`);
		console.log(`[L2 pipeline] uploads done at ${(uploaded / 1000).toFixed(1)} s, all ${COUNT} settled at ${(settledAt / 1000).toFixed(1)} s (${((settledAt - uploaded) / 1000 / COUNT).toFixed(1)} s a photo after the uploads)`);
		console.log(`[L2 memory] worker: sampled RSS at most ${mib(max((s) => s.workerRss))}, peak (VmHWM) ${mib(after.worker.hwm)}, after ${mib(after.worker.rss)}; budget ${mib(WORKER_BUDGET)}. App: sampled RSS at most ${mib(max((s) => s.appRss))}, peak ${mib(after.app.hwm)}, after ${mib(after.app.rss)}; budget ${mib(APP_BUDGET)}`);
		// The worker's memory as the photos went through: growth from one photo to the next is a leak.
		const rssAfter = (n: number) => (n === COUNT ? after.worker.rss : Math.max(...samples.filter((s) => s.recorded === n).map((s) => s.workerRss), 0));
		const marks = [1, 5, 10, 15, 20, 25, COUNT];
		console.log(`[L2 memory] worker RSS with n photos recorded: ${marks.map((n) => `${n}: ${mib(rssAfter(n))}`).join(', ')}`);
		// The process that does the work (tsx's child node), and the priority its threads run at.
		const workerNode = after.worker.largest.pid;
		const nices = threadNice(workerNode);
		console.log(`[L2 cpu] while the worker was busy: worker ${busyCores.worker.toFixed(2)} cores, app ${busyCores.app.toFixed(2)} cores (of ${os.cpus().length}); worker's ${nices.length} threads at nice ${[...new Set(nices)].join(', ')} (configured ${config().MENISCUS_WORKER_NICE})`);
		console.log(`[L2 p99] baseline ${baseline.latency.p99} ms, worker busy ${during.latency.p99} ms: ${ratio.toFixed(2)}× (pass at ≤ ${P99_RATIO}× or < ${P99_FLOOR_MS} ms)`);

		// (1) Queue bounded (ASVS 5.0 15.2.2): the worker never holds more jobs than its concurrency;
		// the others wait as rows in the database (pg-boss marks a job active when a worker fetches it).
		expect(max((s) => s.inHand)).toBeLessThanOrEqual(concurrency);
		// pg-boss 10 writes a finished job's completion without waiting for it before fetching the next
		// (src/manager.js, onFetch), so for a moment a slot can show its next job and its last one.
		expect(max((s) => s.active)).toBeLessThanOrEqual(2 * concurrency);
		expect(max((s) => s.processing)).toBeLessThanOrEqual(concurrency);
		expect(max((s) => s.waiting)).toBeGreaterThan(0);
		// The busy window was busy: the worker had a job in hand throughout it, and work left after.
		expect(busy.length).toBeGreaterThan(0);
		expect(busy.filter((s) => s.inHand + s.processing === 0).length).toBeLessThanOrEqual(Math.ceil(busy.length * 0.1));
		expect(left.active + left.waiting).toBeGreaterThan(0);

		// (2) Memory under budget (sharp docs: one decode per job, libvips cache off; budgets above).
		expect(max((s) => s.workerRss)).toBeLessThanOrEqual(WORKER_BUDGET);
		expect(after.worker.hwm).toBeLessThanOrEqual(WORKER_BUDGET);
		expect(max((s) => s.appRss)).toBeLessThanOrEqual(APP_BUDGET);
		expect(after.app.hwm).toBeLessThanOrEqual(APP_BUDGET);

		// (3) Other routes served (TESTPLAN L2): the worker runs below the app's priority, every thread
		// of it (so decoding yields the cores to the app's answers)...
		expect(nices.every((n) => n === config().MENISCUS_WORKER_NICE)).toBe(true);
		// ...and the reads get no error, and p99 within 2× of the baseline or under the floor.
		for (const r of [baseline, during]) expect([r.errors, r.timeouts, r.non2xx]).toEqual([0, 0, 0]);
		expect(p99Passes(during, baseline), `p99 ${during.latency.p99} ms against ${baseline.latency.p99} ms`).toBe(true);

		// (4) Every upload recorded, with the SHA-256 of its file, as the API answers and on disk.
		expect(states.map((s) => s.state).sort()).toEqual(Array(COUNT).fill('recorded'));
		const hashes = new Set<string>();
		for (const { id, img } of uploads) {
			const res = await call(`/api/uploads/status?id=${id}`, { cookie });
			const [u] = ((await res.json()) as { uploads: UploadStatusBody[] }).uploads;
			expect(u?.state).toBe('recorded');
			const [photo] = await db().query<{ sha256: string; master_path: string; width: number; height: number }>(`SELECT sha256, master_path, width, height FROM photos WHERE id = :id`, { replacements: { id: u!.photoId }, type: QueryTypes.SELECT });
			const expected = await sha256OfFile(img.file);
			hashes.add(expected);
			expect(photo!.sha256).toBe(expected);
			expect(await sha256OfFile(resolveStored(photo!.master_path))).toBe(expected);
			expect([photo!.width, photo!.height]).toEqual([img.width, img.height]);
		}
		// 30 different files, not one file 30 times.
		expect(hashes.size).toBe(COUNT);
		// Nothing errored on the way: no ingest job of these failed or needed a retry.
		const jobs = await db().query<{ state: string; retry_count: number }>(`SELECT state, retry_count FROM pgboss.job WHERE name = :q AND data->>'uploadId' IN (:ids)`, { replacements: { q: INGEST_QUEUE, ids }, type: QueryTypes.SELECT });
		expect(jobs.map((j) => [j.state, j.retry_count])).toEqual(Array(COUNT).fill(['completed', 0]));
	}, SETTLE_MS + 10 * 60_000);
});
