import fs from 'node:fs';
import path from 'node:path';
import { clusterRunning, DEFAULT_PG_PORT, startCluster } from '../../../db/cluster.mjs';
import { clusterDataDir } from '../clusterHome.mjs';
import { uploadsRoot } from '../../../src/lib/server/photos/storage.ts';

export interface AppData {
	url: string;
	uploadsDir: string;
	/** Stops the project's cluster again if this command started it. */
	release(): Promise<void>;
}

/**
 * The database and uploads folder the app uses: DATABASE_URL when it is set (as for
 * `node dist/server/entry.mjs`), else the project's own cluster that `npm start` runs (started
 * here if it is not running, and stopped again afterwards). The uploads folder comes from the
 * app's own settings (MENISCUS_UPLOADS_DIR, default ./uploads), so both always agree.
 */
export async function appData(root: string, log: (m: string) => void): Promise<AppData> {
	let release = async () => {};
	if (!process.env.DATABASE_URL) {
		const dataDir = clusterDataDir(root, log);
		if (!fs.existsSync(path.join(dataDir, 'PG_VERSION'))) throw new Error(`No database yet in ${dataDir}: run \`npm start\` once, or set DATABASE_URL.`);
		const port = process.env.MENISCUS_PG_PORT ? Number(process.env.MENISCUS_PG_PORT) : DEFAULT_PG_PORT;
		const wasRunning = clusterRunning(dataDir);
		const db = await startCluster({ dataDir, port, log, database: 'meniscus' });
		if (!wasRunning) release = async () => void (await db.stop());
		process.env.DATABASE_URL = db.url;
	}
	return { url: process.env.DATABASE_URL!, uploadsDir: uploadsRoot(), release };
}
