import path from 'node:path';
import pg from 'pg';
import { inject } from 'vitest';
import { createDatabase, freePort } from '../../db/cluster.mjs';
import { migrateUp } from '../../db/migrate.ts';
import { openSequelize, closeDb } from '../../src/lib/server/db.ts';
import { startService, stopService, waitForHttp, type Service } from '../../scripts/lib/proc.mjs';
import { useOwnStack } from './server.ts';

/**
 * An app and a photo worker of a test's own, on a database of its own in the test cluster (created
 * and migrated here, as the global set-up does, with no demo data) and an uploads folder the test
 * chooses: the disk-full test puts it on a small tmpfs. The global worker only serves the global
 * database's queue, so the jobs of this stack are taken by its own worker alone, and the test can
 * stop and start that worker when it wants a job to wait. This test process's server modules (the
 * models, sessions) point at the same database and folder (useOwnStack).
 */
export interface OwnStack {
	base: string;
	databaseUrl: string;
	uploadsDir: string;
	/** Every line the worker printed, for waiting on it and for the report. */
	workerLog: string[];
	startWorker(): void;
	stopWorker(): Promise<void>;
	/** Stops both processes and drops the database. */
	stop(): Promise<void>;
}

const root = path.resolve(import.meta.dirname, '..', '..');
const quiet = !process.env.MENISCUS_TEST_SERVER_LOG;

const withUrlDatabase = (url: string, name: string) => url.replace(/\/[^/]+$/, `/${name}`);

export async function startOwnStack(tag: string, uploadsDir: string): Promise<OwnStack> {
	const name = `meniscus_${tag}_${process.pid}`;
	await createDatabase({ dataDir: inject('clusterDataDir'), port: inject('clusterPort'), name });
	const databaseUrl = withUrlDatabase(inject('databaseUrl'), name);
	const sequelize = openSequelize(databaseUrl);
	try {
		await migrateUp(sequelize);
	} finally {
		await sequelize.close();
	}
	const port = await freePort();
	const base = `http://127.0.0.1:${port}`;
	const env = { ...inject('serverEnv'), PORT: String(port), MENISCUS_PUBLIC_URL: base, DATABASE_URL: databaseUrl, MENISCUS_UPLOADS_DIR: uploadsDir };
	useOwnStack({ DATABASE_URL: databaseUrl, MENISCUS_UPLOADS_DIR: uploadsDir, MENISCUS_PUBLIC_URL: base });
	const app: Service = startService(`${tag}-app`, process.execPath, ['dist/server/entry.mjs'], { cwd: root, quiet, env });
	let worker: Service | undefined;
	const workerLog: string[] = [];
	const stack: OwnStack = {
		base,
		databaseUrl,
		uploadsDir,
		workerLog,
		startWorker() {
			worker = startService(`${tag}-worker`, path.join(root, 'node_modules', '.bin', 'tsx'), ['scripts/worker.ts'], { cwd: root, quiet, env });
			worker.stdout!.on('data', (d: string) => workerLog.push(...d.split('\n').filter((l) => l.trim())));
			worker.stderr!.on('data', (d: string) => workerLog.push(...d.split('\n').filter((l) => l.trim())));
		},
		async stopWorker() {
			await stopService(worker);
			worker = undefined;
		},
		async stop() {
			await stopService(worker);
			await stopService(app);
			await closeDb();
			const admin = new pg.Client({ connectionString: withUrlDatabase(inject('databaseUrl'), 'postgres') });
			await admin.connect();
			try {
				// name is ours (letters, digits, underscores), so it is safe in the statement.
				await admin.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
			} finally {
				await admin.end();
			}
		},
	};
	try {
		await waitForHttp(`${base}/login`, { child: app });
	} catch (err) {
		await stack.stop().catch(() => {});
		throw err;
	}
	return stack;
}
