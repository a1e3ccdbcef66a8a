// `npm start`: everything from a fresh clone to a running app with demo data. Dependencies,
// PostgreSQL (from Debian when missing), the project's own cluster, migrations, the demo collection,
// a build when the sources changed, the local fake mail server, then the app on 127.0.0.1:4321 and
// the photo worker.
// Ctrl-C stops the app, the mail fake and the database. Builtins only until npm ci has run.
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { ensureDeps } from './lib/deps.mjs';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const log = (m) => console.log(`[meniscus] ${m}`);
process.env.ASTRO_TELEMETRY_DISABLED = '1';

const [major, minor] = process.versions.node.split('.').map(Number);
if (major < 20 || (major === 20 && minor < 19)) {
	console.error(`Meniscus needs Node.js 20.19 or later (this is ${process.versions.node}).`);
	process.exit(1);
}

ensureDeps(root, log);
const { findPgBin, startCluster, stopCluster, DEFAULT_PG_PORT, freePort } = await import('../db/cluster.mjs');
const { ensureBuild } = await import('./lib/build.mjs');
const { startService, stopService, waitForHttp } = await import('./lib/proc.mjs');
const { demoPassword } = await import('../db/seeders/demoPassword.mjs');
const { clusterDataDir } = await import('./lib/clusterHome.mjs');

const dataDir = clusterDataDir(root, log);
const pgPort = Number(process.env.MENISCUS_PG_PORT || DEFAULT_PG_PORT);
const host = process.env.HOST || '127.0.0.1';
const port = Number(process.env.PORT || 4321);
const children = [];
let stopping = false;

async function shutdown(code = 0) {
	if (stopping) return;
	stopping = true;
	log('Stopping…');
	for (const c of children.reverse()) await stopService(c);
	await stopCluster({ dataDir, log }).catch((e) => console.error(e.message));
	process.exit(code);
}
process.on('SIGINT', () => shutdown(0));
process.on('SIGTERM', () => shutdown(0));

try {
	await findPgBin({ install: true, log });
	const db = await startCluster({ dataDir, port: pgPort, log, database: 'meniscus' });
	const tsx = path.join(root, 'node_modules', '.bin', 'tsx');
	const prep = startService('db', tsx, ['scripts/prepare-db.ts'], { cwd: root, env: { DATABASE_URL: db.url } });
	const { code } = await prep.exited;
	if (code !== 0) throw new Error('Preparing the database failed; see the messages above.');
	ensureBuild(root, log);

	// The fake SMTP server stands in for real mail unless SMTP_HOST points elsewhere.
	const env = { DATABASE_URL: db.url, HOST: host, PORT: String(port) };
	env.MENISCUS_PUBLIC_URL = process.env.MENISCUS_PUBLIC_URL || `http://${host}:${port}`;
	if (!process.env.SMTP_HOST) {
		const smtpPort = await freePort();
		const mailboxDir = path.join(root, 'var', 'mailbox');
		fs.mkdirSync(mailboxDir, { recursive: true });
		children.push(startService('mail', tsx, ['scripts/fake-smtp.ts', '--port', String(smtpPort), '--dir', mailboxDir], { cwd: root }));
		Object.assign(env, { SMTP_HOST: '127.0.0.1', SMTP_PORT: String(smtpPort), MENISCUS_MAILBOX_DIR: mailboxDir });
	}
	const app = startService('app', process.execPath, ['dist/server/entry.mjs'], { cwd: root, env });
	children.push(app);
	// Photos are checked and prepared by a worker process of their own (scripts/worker.ts).
	const worker = startService('worker', tsx, ['scripts/worker.ts'], { cwd: root, env });
	children.push(worker);
	worker.exited.then(({ code }) => !stopping && (console.error(`[meniscus] The photo worker stopped (code ${code}).`), shutdown(1)));
	app.exited.then(({ code }) => !stopping && (console.error(`[meniscus] The app stopped (code ${code}).`), shutdown(1)));
	await waitForHttp(`http://${host}:${port}/login`, { child: app });
	const pw = demoPassword();
	console.log(`
  Meniscus is running at http://${host}:${port}

  Demo sign-ins (password ${pw}):
    conservator@example.org   reviewer@example.org
    curator@example.org       admin@example.org

  E-mail goes to the local mailbox (Administration › Mailbox). Ctrl-C stops everything.
`);
} catch (err) {
	console.error(`[meniscus] ${err.message}`);
	await shutdown(1);
}
