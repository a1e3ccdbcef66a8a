import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { freePort, removeCluster, startCluster } from '../../db/cluster.mjs';
import { ensureBuild } from '../../scripts/lib/build.mjs';
import { startService, stopService, waitForHttp, type Service } from '../../scripts/lib/proc.mjs';
import { demoPassword } from '../../db/seeders/demoPassword.mjs';
import { openSequelize } from '../../src/lib/server/db.ts';
import { migrateUp } from '../../db/migrate.ts';
import { seedDemo } from '../../db/seeders/demo.ts';
import { startFakeSmtp } from '../../src/lib/server/mail/fakeSmtp.ts';
import { specimenRecord } from '../../tests/helpers/specimens.ts';

/**
 * The built app as the benchmarks that need it run it: a throwaway PostgreSQL in a temp folder on a
 * free port, migrated and seeded with the demo collection (no demo photos), the fake SMTP server,
 * the production build, and optionally the photo worker. `stop()` removes it all, also on failure.
 */
export interface AppStack {
	baseUrl: string;
	/** The temp folder everything lives in (removed by stop). */
	tmp: string;
	uploadsDir: string;
	app: Service;
	stop(): Promise<void>;
}

export async function startAppStack(name: string, opts: { worker?: boolean; log: (m: string) => void }): Promise<AppStack> {
	const root = path.resolve(import.meta.dirname, '..', '..');
	const tmp = fs.mkdtempSync(path.join(os.tmpdir(), `meniscus-bench-${name}-`));
	// As root, the postgres OS user must be able to enter the folder (mkdtemp makes it 0700).
	fs.chmodSync(tmp, 0o755);
	const dataDir = path.join(tmp, 'pg', 'data');
	const uploadsDir = path.join(tmp, 'uploads');
	const services: Service[] = [];
	let smtp: Awaited<ReturnType<typeof startFakeSmtp>> | undefined;
	const stop = async () => {
		for (const s of services.reverse()) await stopService(s);
		await smtp?.close();
		await removeCluster({ dataDir }).catch(() => {});
		fs.rmSync(tmp, { recursive: true, force: true });
	};
	try {
		const db = await startCluster({ dataDir, port: await freePort(), log: () => {}, database: `bench_${name}` });
		const seq = openSequelize(db.url);
		await migrateUp(seq);
		await seedDemo(seq, { password: demoPassword() });
		await seq.close();
		if (ensureBuild(root, opts.log)) opts.log('built the app');
		const mailboxDir = path.join(tmp, 'mailbox');
		smtp = await startFakeSmtp({ mailboxDir, log: () => {} });
		const port = await freePort();
		const baseUrl = `http://127.0.0.1:${port}`;
		const env = { HOST: '127.0.0.1', PORT: String(port), DATABASE_URL: db.url, MENISCUS_PUBLIC_URL: baseUrl, MENISCUS_UPLOADS_DIR: uploadsDir, SMTP_HOST: '127.0.0.1', SMTP_PORT: String(smtp.port), MENISCUS_MAILBOX_DIR: mailboxDir };
		const quiet = !process.env.BENCH_SERVER_LOG;
		const app = startService('app', process.execPath, ['dist/server/entry.mjs'], { cwd: root, env, quiet });
		services.push(app);
		// The worker prepares uploads (checks, master, IIIF tiles) as in production.
		if (opts.worker) services.push(startService('worker', process.execPath, ['--import', 'tsx', 'scripts/worker.ts'], { cwd: root, env, quiet }));
		await waitForHttp(`${baseUrl}/login`, { child: app });
		return { baseUrl, tmp, uploadsDir, app, stop };
	} catch (err) {
		await stop();
		throw err;
	}
}

/** Registers a specimen through the API (the body the tests use) and returns its id. */
export async function createSpecimen(baseUrl: string, cookie: string, prefix: string): Promise<string> {
	const res = await fetch(`${baseUrl}/api/specimens`, {
		method: 'POST',
		headers: { origin: baseUrl, cookie, 'content-type': 'application/json' },
		body: JSON.stringify(specimenRecord(prefix)),
	});
	if (res.status !== 201) throw new Error(`specimen: ${res.status} ${await res.text()}`);
	return ((await res.json()) as { specimen: { id: string } }).specimen.id;
}
