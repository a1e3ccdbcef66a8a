import fs from 'node:fs';
import path from 'node:path';
import { closeDb } from '../../../src/lib/server/db.ts';
import { UsageError } from './args.ts';
import { appData, type AppData } from './target.ts';

/** The project root (where package.json is): relative paths and ./backups are taken from here. */
export const ROOT = path.resolve(import.meta.dirname, '..', '..', '..');

export const log = (m: string) => console.error(`[meniscus] ${m}`);

export function appVersion(): { name: string; version: string } {
	const pkg = JSON.parse(fs.readFileSync(path.join(ROOT, 'package.json'), 'utf8')) as { name: string; version: string };
	return { name: pkg.name, version: pkg.version };
}

export const mib = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(1)} MiB`;
export const seconds = (ms: number) => `${(ms / 1000).toFixed(1)} s`;

/**
 * Runs a backup or restore command: the usage on a wrong command line (exit 2), the message of
 * any other failure (exit 1), and the project's cluster stopped again if the command started it.
 */
export async function runCli(usage: string, main: (data: () => Promise<AppData>) => Promise<void>): Promise<void> {
	let data: AppData | undefined;
	try {
		await main(async () => (data = await appData(ROOT, log)));
	} catch (err) {
		if (err instanceof UsageError) {
			console.error(`error: ${err.message}\nusage: ${usage}`);
			process.exitCode = 2;
		} else {
			console.error(`error: ${(err as Error).message}`);
			process.exitCode = 1;
		}
	} finally {
		await closeDb().catch(() => {});
		await data?.release().catch((e: Error) => console.error(`could not stop the database again: ${e.message}`));
	}
}
