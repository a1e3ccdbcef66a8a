// The photo worker: takes ingest jobs from the PostgreSQL queue (pg-boss), and at start and every
// few minutes runs the reconciler and a fixity pass (re-hashing masters checked longest ago). A process of its own, so that decoding a flood of large photos
// never holds up the web server, and so that more workers can run on other machines later.
// It also sends the daily digest of checks coming due (a pg-boss schedule; once per user per day
// however many workers run, see src/lib/server/mail/digest.ts).
// Started by `npm start` and by the tests; `npm run worker` runs one by hand.
import { config } from '../src/lib/server/config.ts';
import { db, closeDb } from '../src/lib/server/db.ts';
import { isDatabaseUnavailable } from '../src/lib/server/dbErrors.ts';
import { INGEST_QUEUE, queue, stopQueue, type IngestJob } from '../src/lib/server/photos/queue.ts';
import { ingestUpload } from '../src/lib/server/photos/ingest.ts';
import { reconcile } from '../src/lib/server/photos/reconcile.ts';
import { fixityPass } from '../src/lib/server/photos/fixity.ts';
import { configureSharp } from '../src/lib/server/photos/pipeline.ts';
import { ensureDirs } from '../src/lib/server/photos/storage.ts';
import { lowerPriority } from '../src/lib/server/photos/priority.ts';
import { DIGEST_CRON, DIGEST_QUEUE, digestDate, runDueDigest } from '../src/lib/server/mail/digest.ts';

const log = (m: string) => console.log(`${new Date().toISOString()} ${m}`);
// pg-boss 10 records a job's outcome (complete/fail in manager.js) without awaiting it, so when the
// database is down at that moment the rejection goes unhandled, and Node would end the worker (and
// `npm start` with it). The outcome is lost, not the job: it expires and is retried. Anything else
// unhandled still ends the process.
process.on('unhandledRejection', (err) => {
	if (!isDatabaseUnavailable(err)) throw err;
	log(`database unavailable while recording a job's outcome: ${(err as Error).message}`);
});
const cfg = config();
// Before any photo work starts threads: they inherit it (TESTPLAN L2, other routes keep their pace).
lowerPriority(cfg.MENISCUS_WORKER_NICE);
configureSharp(cfg.MENISCUS_SHARP_THREADS);
ensureDirs();
db();
const boss = await queue('worker');

for (let i = 0; i < cfg.MENISCUS_PHOTO_JOBS; i++) {
	await boss.work<IngestJob>(INGEST_QUEUE, { batchSize: 1, pollingIntervalSeconds: 0.5 }, async ([job]) => {
		if (!job) return;
		const started = Date.now();
		const outcome = await ingestUpload(job.data.uploadId).catch((err: Error) => {
			// pg-boss retries it with back-off (a full disk, a database outage); the log says why.
			log(`${job.data.uploadId}: failed, to be retried (${err.message})`);
			throw err;
		});
		log(`${job.data.uploadId}: ${outcome.state}${'reason' in outcome ? ` (${outcome.code}: ${outcome.reason})` : ''}${'why' in outcome ? ` (${outcome.why})` : ''} in ${Date.now() - started} ms`);
	});
}

await boss.createQueue(DIGEST_QUEUE, { name: DIGEST_QUEUE, policy: 'standard', retryLimit: 3, retryDelay: 300, expireInMinutes: 30 });
await boss.schedule(DIGEST_QUEUE, DIGEST_CRON, undefined, { tz: 'UTC' });
await boss.work(DIGEST_QUEUE, { batchSize: 1 }, async () => {
	const date = digestDate();
	log(`due digest ${date}: ${await runDueDigest(date)} queued`);
});

let running = false;
async function pass() {
	if (running) return;
	running = true;
	try {
		const r = await reconcile();
		const n = r.queued.length + r.recovered.length + r.refused.length + r.cleaned.length + r.expired.length;
		if (n > 0 || r.unreadable.length > 0) log(`reconciler: queued ${r.queued.length}, recovered ${r.recovered.length}, refused ${r.refused.length}, cleaned ${r.cleaned.length}, expired ${r.expired.length}, unreadable ${r.unreadable.length}`);
		// Re-hash up to 2 GiB of masters per pass, oldest-checked first.
		const f = await fixityPass({ olderThanDays: cfg.MENISCUS_FIXITY_DAYS, byteBudget: 2 * 1024 ** 3 });
		if (f.problems.length > 0) log(`fixity: ${f.problems.length} problem(s): ${f.problems.map((p) => `${p.photoId} ${p.outcome}`).join(', ')}`);
	} catch (err) {
		log(`reconciler or fixity pass failed: ${(err as Error).message}`);
	} finally {
		running = false;
	}
}
await pass();
const timer = setInterval(pass, cfg.MENISCUS_RECONCILE_MINUTES * 60_000);
log(`photo worker ready (${cfg.MENISCUS_PHOTO_JOBS} job(s) at a time, ${cfg.MENISCUS_SHARP_THREADS} thread(s) each, nice ${cfg.MENISCUS_WORKER_NICE})`);

async function stop() {
	clearInterval(timer);
	await stopQueue();
	await closeDb();
	process.exit(0);
}
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
