import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { freePort, removeCluster, startCluster } from '../../db/cluster.mjs';
import { ensureBuild } from '../../scripts/lib/build.mjs';
import { startService, stopService, waitForHttp } from '../../scripts/lib/proc.mjs';
import { migrateUp } from '../../db/migrate.ts';
import { seedDemo } from '../../db/seeders/demo.ts';
import { seedDemoPhotos } from '../../db/seeders/demoPhotos.ts';
import { closeDb, openSequelize } from '../../src/lib/server/db.ts';
import { startFakeSmtp } from '../../src/lib/server/mail/fakeSmtp.ts';

/**
 * The real parts the integration and browser tests use: a throwaway PostgreSQL cluster in a temp
 * folder on a free port (removed afterwards, failed run or not), migrated and seeded with the demo
 * collection; the fake SMTP server; the production build of the app served on another free port.
 */
declare module 'vitest' {
	export interface ProvidedContext {
		baseUrl: string;
		databaseUrl: string;
		mailboxDir: string;
		demoPassword: string;
		clusterDataDir: string;
		clusterPort: number;
		uploadsDir: string;
		/** The environment the app and the worker were started with (for tests that start their own). */
		serverEnv: Record<string, string>;
		/** Process ids of the app and the photo worker (the worker's is tsx's, its node is a child). */
		servicePids: { app: number; worker: number };
	}
}

export const TEST_PASSWORD = 'test-jar-password-0427';

export default async function setup(project: TestProject) {
	if (process.env.MENISCUS_TEST_SCOPE === 'unit') return;
	const root = path.resolve(import.meta.dirname, '..', '..');
	const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'meniscus-test-'));
	// As root, the postgres OS user must be able to enter the folder (mkdtemp makes it 0700).
	fs.chmodSync(tmp, 0o755);
	const dataDir = path.join(tmp, 'pg', 'data');
	const quiet = () => {};
	let server: ReturnType<typeof startService> | undefined;
	let worker: ReturnType<typeof startService> | undefined;
	let smtp: Awaited<ReturnType<typeof startFakeSmtp>> | undefined;
	const teardown = async () => {
		await stopService(worker);
		await stopService(server);
		await smtp?.close();
		await removeCluster({ dataDir }).catch(() => {});
		fs.rmSync(tmp, { recursive: true, force: true });
	};
	try {
		const pgPort = await freePort();
		const db = await startCluster({ dataDir, port: pgPort, log: quiet, database: 'meniscus_test' });
		const sequelize = openSequelize(db.url);
		await migrateUp(sequelize);
		await seedDemo(sequelize, { password: TEST_PASSWORD });
		// The demo photographs go through the real ingest, which reads its settings from the environment.
		const uploadsDir = path.join(tmp, 'uploads');
		process.env.DATABASE_URL = db.url;
		process.env.MENISCUS_UPLOADS_DIR = uploadsDir;
		const photosStarted = Date.now();
		const photos = await seedDemoPhotos(sequelize, { scope: 'latest' });
		console.log(`[test setup] ${photos} demo photographs drawn and ingested in ${((Date.now() - photosStarted) / 1000).toFixed(1)} s`);
		await closeDb();
		await sequelize.close();

		ensureBuild(root, (m: string) => console.log(`[test setup] ${m}`));
		const mailboxDir = path.join(tmp, 'mailbox');
		smtp = await startFakeSmtp({ mailboxDir, log: quiet });
		const port = await freePort();
		const baseUrl = `http://127.0.0.1:${port}`;
		const env = {
			HOST: '127.0.0.1',
			PORT: String(port),
			DATABASE_URL: db.url,
			MENISCUS_PUBLIC_URL: baseUrl,
			SMTP_HOST: '127.0.0.1',
			SMTP_PORT: String(smtp.port),
			MENISCUS_MAILBOX_DIR: mailboxDir,
			MENISCUS_UPLOADS_DIR: uploadsDir,
			MENISCUS_RECONCILE_MINUTES: '0.05',
		};
		const quietServer = !process.env.MENISCUS_TEST_SERVER_LOG;
		server = startService('app', process.execPath, ['dist/server/entry.mjs'], { cwd: root, quiet: quietServer, env });
		worker = startService('worker', path.join(root, 'node_modules', '.bin', 'tsx'), ['scripts/worker.ts'], { cwd: root, quiet: quietServer, env });
		await waitForHttp(`${baseUrl}/login`, { child: server });

		project.provide('baseUrl', baseUrl);
		project.provide('databaseUrl', db.url);
		project.provide('mailboxDir', mailboxDir);
		project.provide('demoPassword', TEST_PASSWORD);
		project.provide('clusterDataDir', dataDir);
		project.provide('clusterPort', pgPort);
		project.provide('uploadsDir', uploadsDir);
		project.provide('serverEnv', env);
		project.provide('servicePids', { app: server.pid!, worker: worker.pid! });
	} catch (err) {
		await teardown();
		throw err;
	}
	return teardown;
}
