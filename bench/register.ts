// Register query at collection scale: a throwaway PostgreSQL with 10,000 invented specimens (three
// approved checks each), then the register's first page under the common views and the collection
// overview (whole, one store, one collection, and its parts), against a baseline measured in the
// same run (one round trip `SELECT 1`, and `SELECT count(*)` over the table). Prints medians and p95
// in ms and ratios to the baseline. Run: `npm run bench -- register` (or all: `npm run bench`).
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { freePort, removeCluster, startCluster } from '../db/cluster.mjs';
import { openSequelize } from '../src/lib/server/db.ts';
import { migrateUp } from '../db/migrate.ts';
import { seedDemo } from '../db/seeders/demo.ts';
import { insertGenerated, insertGeneratedChecks } from '../db/seeders/generated.ts';
import { RegisterQuerySchema } from '../src/lib/specimen/query.ts';
import { emitPart, table, emitHeadline } from './lib/report.ts';

const N = Number(process.env.BENCH_SPECIMENS ?? 10_000);
const RUNS = Number(process.env.BENCH_RUNS ?? 40);
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'meniscus-bench-'));
fs.chmodSync(tmp, 0o755);
const dataDir = path.join(tmp, 'pg', 'data');

async function time(fn: () => Promise<unknown>): Promise<{ median: number; p95: number }> {
	for (let i = 0; i < 3; i++) await fn(); // warm caches and plans
	const ms: number[] = [];
	for (let i = 0; i < RUNS; i++) {
		const t = performance.now();
		await fn();
		ms.push(performance.now() - t);
	}
	ms.sort((a, b) => a - b);
	return { median: ms[Math.floor(ms.length / 2)]!, p95: ms[Math.floor(ms.length * 0.95)]! };
}

try {
	const db = await startCluster({ dataDir, port: await freePort(), log: () => {}, database: 'bench' });
	process.env.DATABASE_URL = db.url;
	const seq = openSequelize(db.url);
	await migrateUp(seq);
	await seedDemo(seq, { password: 'bench-password-not-used' });
	const t0 = performance.now();
	await insertGenerated(seq, N);
	const checks = await insertGeneratedChecks(seq, { perJar: 3 });
	await seq.query('ANALYZE');
	console.log(`inserted ${N} specimens and ${checks} checks in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
	const { registerPage } = await import('../src/lib/server/specimens/register.ts');
	const { db: appDb } = await import('../src/lib/server/db.ts');
	appDb();
	const { collectionOverview } = await import('../src/lib/server/overview/overview.ts');
	const { figures } = await import('../src/lib/server/overview/figures.ts');
	const { fluidLoss } = await import('../src/lib/server/overview/fluidLoss.ts');
	const { inventory, airspaceAtRisk } = await import('../src/lib/server/overview/stores.ts');
	const { StorageLocation } = await import('../src/lib/server/models/index.ts');
	const stores = await StorageLocation.findAll();
	const store = stores.find((l) => l.code === 'SPR-A2')!;
	const day = new Date().toISOString().slice(0, 10);
	const whole = await collectionOverview({});
	console.log(`overview: ${whole.specimens} specimens, ${whole.fluidLoss.considered} jars falling, ${whole.airspace.rows.length}${whole.airspace.truncated ? '+' : ''} at risk`);
	const q = (over: Record<string, string>) => RegisterQuerySchema.parse(over);
	const cases: [string, () => Promise<unknown>][] = [
		['baseline: SELECT 1', () => seq.query('SELECT 1')],
		['baseline: count(*) of specimens', () => seq.query('SELECT count(*) FROM specimens')],
		['first page, by object number', () => registerPage(q({}))],
		['first page, by next check due', () => registerPage(q({ sort: 'nextCheckDue' }))],
		['search "frog"', () => registerPage(q({ q: 'frog' }))],
		['filter formalin + overdue', () => registerPage(q({ preservative: 'formalin', due: 'overdue' }))],
		['filter hazard lead', () => registerPage(q({ hazard: 'lead' }))],
		['page 100, by location', () => registerPage(q({ sort: 'location', page: '100' }))],
		['overview, whole collection', () => collectionOverview({})],
		['overview, one store', () => collectionOverview({ location: store.id })],
		['overview, one collection', () => collectionOverview({ collection: 'Comparative anatomy' })],
		['overview part: counts', () => figures({}, day)],
		['overview part: fluid loss (SQL fit + JS judging)', () => fluidLoss({}, day)],
		['overview part: store totals', () => inventory({}, stores)],
		['overview part: airspace at risk', async () => airspaceAtRisk({}, stores, await inventory({}, stores))],
	];
	const results: [string, { median: number; p95: number }][] = [];
	for (const [name, fn] of cases) results.push([name, await time(fn)]);
	const base = results[1]![1].median;
	console.log(`\n${N} specimens, ${RUNS} runs each (ms)          median      p95   × count(*)`);
	for (const [name, r] of results) {
		console.log(`${name.padEnd(40)} ${r.median.toFixed(2).padStart(8)} ${r.p95.toFixed(2).padStart(8)} ${(r.median / base).toFixed(2).padStart(10)}`);
	}
	for (const [name, r] of results) if (name === 'first page, by object number' || name === 'overview, whole collection') emitHeadline({ label: `register: ${name} ÷ count(*)`, ratio: r.median / base });
	emitPart(
		[
			'## Register query at collection scale',
			'',
			`${N.toLocaleString('en-GB')} invented specimens with ${checks.toLocaleString('en-GB')} approved checks in a throwaway PostgreSQL; the register's first page under the common views, and the collection overview (the whole of GET /api/overview's work but HTTP, then its parts; the airspace part includes the store totals it needs), ${RUNS} runs each after 3 warm-up runs. Baseline in the same run: \`SELECT count(*)\` over the table (and one round trip, \`SELECT 1\`).`,
			'',
			table(['query', 'median (ms)', 'p95 (ms)', '× count(*)'], results.map(([name, r]) => [name, r.median.toFixed(2), r.p95.toFixed(2), `${(r.median / base).toFixed(2)}×`])),
		].join('\n'),
		{ print: false },
	);
	await seq.close();
	const { closeDb } = await import('../src/lib/server/db.ts');
	await closeDb();
} finally {
	await removeCluster({ dataDir }).catch(() => {});
	fs.rmSync(tmp, { recursive: true, force: true });
}
