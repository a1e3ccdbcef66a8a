import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { call, useTestDatabase } from '../helpers/server.ts';
import { signedInUser } from '../helpers/users.ts';
import { sampleJpeg, settled, tusUpload, writeTiff } from '../helpers/photos.ts';
import { expectAcknowledgedKept, saveTargets, startSavers, type SaveTarget } from '../helpers/savers.ts';
import { checkStoredPhotos } from '../helpers/photoFiles.ts';
import { killCluster } from '../helpers/pgCrash.ts';
import { startCluster } from '../../db/cluster.mjs';

/**
 * TESTPLAN F5, power loss. A VM reset cannot be done from inside the machine (tests/README.md says
 * so); what can be done is done. (1) Both clusters, the one `npm start` makes and the test cluster,
 * run with fsync, synchronous_commit and full_page_writes on (PostgreSQL docs §19.5.1 and §28.1:
 * with any of them off a crash can lose or corrupt committed data), set by db/cluster.mjs and
 * overridden nowhere. (2) Every PostgreSQL process is SIGKILLed right after uploads were
 * acknowledged (204) and recorded and saves acknowledged, then started again (crash recovery from
 * the WAL): every photo row still has its master with the recorded size and SHA-256 and every
 * derivative it names, every acknowledged save reads back. The order "files fsynced, file then
 * folder, before the row commits" is proven in ingestDurability.test.ts: a kill of PostgreSQL
 * alone leaves the OS page cache standing, so it cannot show it.
 */
const root = path.resolve(import.meta.dirname, '..', '..');
const SETTINGS = ['fsync', 'synchronous_commit', 'full_page_writes'];
let cookie = '';
let targets: SaveTarget[] = [];
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'meniscus-f5-'));
afterAll(() => fs.rmSync(tmp, { recursive: true, force: true }));

async function query<T extends pg.QueryResultRow>(sql: string): Promise<T[]> {
	const client = new pg.Client({ connectionString: inject('databaseUrl') });
	await client.connect();
	try {
		return (await client.query<T>(sql)).rows;
	} finally {
		await client.end();
	}
}

beforeAll(async () => {
	useTestDatabase();
	({ cookie } = await signedInUser('conservator', 'power'));
	targets = await saveTargets(cookie, `PW${process.pid}`, 3);
});

describe('durability settings (TESTPLAN F5; PostgreSQL docs §19.5.1 WAL settings)', () => {
	it('runs the test cluster with fsync, synchronous_commit and full_page_writes on, from its configuration file', async () => {
		const rows = await query<{ name: string; setting: string; source: string }>(`SELECT name, setting, source FROM pg_settings WHERE name IN ('fsync', 'synchronous_commit', 'full_page_writes') ORDER BY name`);
		expect(rows).toEqual(SETTINGS.sort().map((name) => ({ name, setting: 'on', source: 'configuration file' })));
		// Nor does any database or role turn them off for its sessions (ALTER DATABASE/ROLE … SET).
		const overrides = await query<{ setconfig: string[] }>(`SELECT setconfig FROM pg_db_role_setting`);
		expect(overrides.flatMap((o) => o.setconfig).filter((c) => SETTINGS.some((s) => c.startsWith(`${s}=`)))).toEqual([]);
	});

	it('makes the npm start cluster with the same function and settings (db/cluster.mjs)', () => {
		// scripts/start.mjs calls the startCluster the test set-up calls, which writes these lines at initdb.
		expect(fs.readFileSync(path.join(root, 'scripts', 'start.mjs'), 'utf8')).toMatch(/await startCluster\(\{ dataDir, port: pgPort/);
		const cluster = fs.readFileSync(path.join(root, 'db', 'cluster.mjs'), 'utf8');
		for (const s of SETTINGS) expect(cluster).toContain(`'${s} = on'`);
		// The test cluster's own file holds them as written, and nothing after them says otherwise.
		const conf = fs.readFileSync(path.join(inject('clusterDataDir'), 'postgresql.conf'), 'utf8');
		for (const s of SETTINGS) expect(conf.match(new RegExp(`^\\s*${s}\\s*=\\s*(\\w+)`, 'gm'))?.map((l) => l.split('=')[1]!.trim())).toEqual(['on']);
	});

	it('has no code path that turns them off (the product, its scripts and the database libraries it runs on)', () => {
		const roots = ['src', 'db', 'scripts', 'bench', 'node_modules/pg-boss', 'node_modules/pg', 'node_modules/sequelize/lib', 'node_modules/@lucia-auth/adapter-postgresql', 'node_modules/umzug/lib'];
		const found: string[] = [];
		for (const r of roots) {
			for (const e of fs.readdirSync(path.join(root, r), { recursive: true, withFileTypes: true })) {
				if (!e.isFile() || !/\.(m?[jt]s|cjs|sql)$/.test(e.name)) continue;
				const file = path.join(e.parentPath, e.name);
				const text = fs.readFileSync(file, 'utf8');
				for (const m of text.matchAll(/(synchronous_commit|fsync|full_page_writes)\s*(=|to)\s*'?(off|local|false|0)\b/gi)) found.push(`${path.relative(root, file)}: ${m[0]}`);
			}
		}
		expect(found).toEqual([]);
	});
});

describe('every PostgreSQL process killed with SIGKILL (TESTPLAN F5)', () => {
	it('keeps every acknowledged upload and save, and every photo row its files with the recorded size and hash', async () => {
		const specimenId = targets[0]!.id;
		const upload = async (n: number) => (await tusUpload(await sampleJpeg(900 + n * 16, 700), { cookie, meta: { filename: `power-${n}.jpg`, filetype: 'image/jpeg', specimenId, view: 'front', stage: 'as-found' } })).id;
		// Acknowledged and recorded before the crash…
		const recorded = await Promise.all([1, 2, 3, 4].map(upload));
		for (const id of recorded) expect((await settled(cookie, id, 90_000)).state).toBe('recorded');
		const savers = startSavers({ cookie, targets, retry: [503] });
		// …and acknowledged (204) just before it: a small one, and a 12-megapixel TIFF whose ingest is
		// under way (claimed by the worker) at the moment of the crash.
		const tiff = path.join(tmp, 'power-big.tif');
		await writeTiff(tiff, 4000, 3000);
		const late = [await upload(5), (await tusUpload(tiff, { cookie, meta: { filename: 'power-big.tif', filetype: 'image/tiff', specimenId, view: 'front', stage: 'as-found' } })).id];
		const until = Date.now() + 20_000;
		let processing = false;
		while (!processing && Date.now() < until) processing = (await query<{ state: string }>(`SELECT state FROM photo_uploads WHERE id = '${late[1]}'`))[0]?.state === 'processing';
		const dataDir = inject('clusterDataDir');
		const killed = await killCluster(dataDir);
		await sleep(1_000);
		await startCluster({ dataDir, port: inject('clusterPort'), database: new URL(inject('databaseUrl')).pathname.slice(1), log: () => {} });
		expect(processing, 'the big upload was being ingested when PostgreSQL was killed').toBe(true);
		const t0 = Date.now();
		while (Date.now() - t0 < 30_000 && (await call('/api/me', { cookie })).status !== 200) await sleep(250);
		await sleep(1_500);
		await savers.stop();
		console.log(`[F5] SIGKILL to the postmaster and ${killed.children} children; answers ${JSON.stringify(Object.fromEntries(savers.statuses))}; app back after ${Date.now() - t0} ms`);
		expect(savers.statuses.get(200) ?? 0).toBeGreaterThan(0);
		// Every save the app acknowledged (a commit PostgreSQL reported) survived the crash.
		await expectAcknowledgedKept(cookie, targets);
		// An upload acknowledged before the crash is recorded after it (the worker's job survived too).
		for (const id of late) {
			const done = await settled(cookie, id, 120_000).catch(async (err) => {
				console.log(`[F5] ${id}: ${JSON.stringify(await query(`SELECT state, finished_at, updated_at, (SELECT json_agg(json_build_object('state', j.state, 'retries', j.retry_count, 'out', j.output)) FROM pgboss.job j WHERE j.data->>'uploadId' = u.id) AS jobs FROM photo_uploads u WHERE id = '${id}'`))}`);
				throw err;
			});
			expect(done.state).toBe('recorded');
		}
		const stored = await checkStoredPhotos(inject('databaseUrl'), inject('uploadsDir'));
		console.log(`[F5] ${stored.photos} photo rows and ${stored.derivatives} derivative rows checked against the files`);
		expect(stored.photos).toBeGreaterThanOrEqual(recorded.length + late.length);
		expect(stored.problems).toEqual([]);
	}, 300_000);
});
