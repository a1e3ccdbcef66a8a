import path from 'node:path';
import { inject } from 'vitest';
import { startService, waitForHttp, type Service } from '../../scripts/lib/proc.mjs';

/**
 * Another app process of the test's own (the production build, as the global set-up starts it) on
 * the same database, uploads folder and mail server, so the fault tests can kill it or run several
 * side by side; the global server is never touched. `publicUrl` is the site's address when the app
 * sits behind a proxy (tus's allowed origin); by default its own.
 */
const root = path.resolve(import.meta.dirname, '..', '..');

export async function startApp(name: string, port: number, publicUrl = `http://127.0.0.1:${port}`): Promise<Service> {
	const env = { ...inject('serverEnv'), PORT: String(port), MENISCUS_PUBLIC_URL: publicUrl };
	const child = startService(name, process.execPath, ['dist/server/entry.mjs'], { cwd: root, quiet: !process.env.MENISCUS_TEST_SERVER_LOG, env });
	await waitForHttp(`http://127.0.0.1:${port}/login`, { child });
	return child;
}
