import fsp from 'node:fs/promises';
import path from 'node:path';
import { copyTree, isWithin, writeFileDurably } from './files.ts';
import { buildManifest, DUMP_NAME, FORMAT, MANIFEST_NAME, UPLOADS_PREFIX, type Manifest } from './manifest.ts';
import { describeSnapshot, dumpDatabase, pgDumpVersion, withTransaction } from './postgres.ts';
import { sha256File } from '../../../src/lib/server/photos/storage.ts';

export interface BackupInput {
	url: string;
	uploadsDir: string;
	/** The new backup folder; it must not exist yet. */
	dest: string;
	app: { name: string; version: string };
}

export interface BackupResult {
	dir: string;
	manifest: Manifest;
	ms: number;
}

/**
 * One backup: the database, then the uploads folder, then the manifest.
 *
 * The row counts and digests are read in a REPEATABLE READ transaction whose snapshot pg_dump is
 * handed (--snapshot), so they describe exactly the rows in the dump. The files are copied after
 * the dump because the app writes a photo's files (and fsyncs them) before it commits the rows
 * naming them, and never deletes a master: every photo in the dump then has its files in the copy.
 * Files newer than the dump may come along too; the worker's reconciler deals with those after a
 * restore, as after a crash. Nothing is left out on purpose: unfinished tus uploads (incoming/)
 * are kept, since their records are in the dump and tus resumes them from the bytes they have.
 */
export async function makeBackup({ url, uploadsDir, dest, app }: BackupInput): Promise<BackupResult> {
	const started = new Date();
	// A backup inside the uploads folder would copy itself (and every later backup the ones before).
	if (isWithin(uploadsDir, dest)) throw new Error(`The backup folder ${dest} is inside the uploads folder ${uploadsDir}; choose another place.`);
	// 0700: a backup holds personal data (names, e-mail addresses, photographs' GPS positions).
	await fsp.mkdir(path.dirname(dest), { recursive: true });
	await fsp.mkdir(dest, { mode: 0o700 });
	const dumpFile = path.join(dest, DUMP_NAME);
	const pgDump = await pgDumpVersion();
	const db = await withTransaction(url, 'REPEATABLE READ READ ONLY', async (client) => {
		const { rows } = await client.query<{ snapshot: string }>('SELECT pg_export_snapshot() AS snapshot');
		const seen = await describeSnapshot(client);
		// The transaction stays open until pg_dump is done: an exported snapshot lives only that long.
		await dumpDatabase(url, dumpFile, rows[0]!.snapshot);
		return seen;
	});
	const { size } = await fsp.stat(dumpFile);
	const dumpEntry = { path: DUMP_NAME, size, sha256: await sha256File(dumpFile) };
	const copied = await copyTree(uploadsDir, path.join(dest, 'uploads'), { prefix: UPLOADS_PREFIX, vanishedOk: true });
	const manifest = buildManifest({
		format: FORMAT,
		version: 1,
		startedAt: started.toISOString(),
		finishedAt: new Date().toISOString(),
		app,
		postgres: { server: db.server, pgDump },
		database: { name: db.name, dump: DUMP_NAME, tables: db.tables },
		uploads: { source: uploadsDir, skipped: copied.vanished.map((p) => ({ path: p, reason: 'deleted by the app while the backup ran' })) },
		files: [dumpEntry, ...copied.files],
	});
	// Last, and only once everything it lists is on disk: a folder without it is a half-made backup.
	await writeFileDurably(path.join(dest, MANIFEST_NAME), `${JSON.stringify(manifest, null, '\t')}\n`);
	return { dir: dest, manifest, ms: Date.now() - started.getTime() };
}
