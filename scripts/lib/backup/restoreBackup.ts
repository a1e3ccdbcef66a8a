import fsp from 'node:fs/promises';
import path from 'node:path';
import { compareFiles, compareTables, describeMismatches, type Mismatch } from './compare.ts';
import { copyTree, hasNoFiles, hashTree, isWithin } from './files.ts';
import { DUMP_NAME, MANIFEST_NAME, parseManifest, uploadEntries, UPLOADS_PREFIX, type Manifest } from './manifest.ts';
import { listTables, readDatabase, restoreDatabase, withTransaction } from './postgres.ts';
import { dropSchemas, moveSchemasAside, putSchemasBack } from './schemas.ts';

export interface RestoreInput {
	dir: string;
	url: string;
	uploadsDir: string;
	force: boolean;
}

export interface RestoreReport {
	manifest: Manifest;
	tables: number;
	rows: number;
	files: number;
	bytes: number;
	/** Where a forced restore moved the uploads folder's earlier contents. */
	movedAside: string | null;
	/** From the first read of the backup to the end of the checks: the recovery time. */
	ms: number;
}

/** A restore that did not start (nothing was changed) or whose result does not match the backup. */
export class RestoreError extends Error {
	override name = 'RestoreError';
	constructor(message: string, readonly changedNothing: boolean) {
		super(message);
	}
}

/** Reads and checks a backup folder: manifest, and every file's size and SHA-256, before anything is touched. */
export async function verifyBackup(dir: string): Promise<Manifest> {
	const text = await fsp.readFile(path.join(dir, MANIFEST_NAME), 'utf8').catch((err: NodeJS.ErrnoException) => {
		if (err.code !== 'ENOENT') throw err;
		throw new RestoreError(`${dir} has no ${MANIFEST_NAME}: it is not a backup, or one that never finished. Nothing was changed.`, true);
	});
	const manifest = parseManifest(text);
	const found = (await hashTree(dir)).filter((f) => f.path !== MANIFEST_NAME);
	const wrong = compareFiles(manifest.files, found);
	if (wrong.length) throw new RestoreError(`The backup in ${dir} does not match its manifest; nothing was changed:\n${describeMismatches(wrong)}`, true);
	return manifest;
}

async function emptyTarget(url: string, uploadsDir: string): Promise<{ tables: number; uploadsEmpty: boolean }> {
	const tables = await withTransaction(url, 'READ COMMITTED', async (c) => (await listTables(c)).length);
	return { tables, uploadsEmpty: await hasNoFiles(uploadsDir) };
}

/**
 * Restores a verified backup: the database in one transaction, then the files, then proves both
 * against the manifest (every table's rows and digest, every file's hash, nothing extra). A target
 * with tables or files is refused unless `force`; then its schemas are moved aside until the
 * restored data is proven (schemas.ts), and the uploads folder's old contents are moved aside and
 * kept for the operator to delete: a sibling folder is in no later backup, while old schemas left in
 * the database would be in every one.
 */
export async function restoreBackup({ dir, url, uploadsDir, force }: RestoreInput): Promise<RestoreReport> {
	const started = Date.now();
	// --force moves the uploads folder aside: with the backup inside it, the copy would lose its source.
	if (isWithin(uploadsDir, dir) || isWithin(dir, uploadsDir)) {
		throw new RestoreError(`The backup ${dir} and the uploads folder ${uploadsDir} must not lie inside one another. Nothing was changed.`, true);
	}
	const manifest = await verifyBackup(dir);
	const target = await emptyTarget(url, uploadsDir);
	if ((target.tables > 0 || !target.uploadsEmpty) && !force) {
		const what = [target.tables > 0 && `the database has ${target.tables} tables`, !target.uploadsEmpty && `${uploadsDir} holds files`].filter(Boolean);
		throw new RestoreError(`The target is not empty (${what.join('; ')}). Restore into an empty one, or add --force to replace it. Nothing was changed.`, true);
	}
	const stamp = new Date().toISOString().replace(/\D/g, '').slice(0, 14);
	const oldSchemas = target.tables > 0 ? await moveSchemasAside(url, stamp) : [];
	try {
		await restoreDatabase(url, path.join(dir, DUMP_NAME));
	} catch (err) {
		if (oldSchemas.length) await putSchemasBack(url, oldSchemas);
		throw new RestoreError(`${(err as Error).message}\nThe restore was rolled back; nothing was changed.`, true);
	}
	let movedAside: string | null = null;
	if (!target.uploadsEmpty) {
		movedAside = `${uploadsDir}.before-restore-${stamp}`;
		await fsp.rename(uploadsDir, movedAside);
	}
	await copyTree(path.join(dir, UPLOADS_PREFIX), uploadsDir);

	// Read back from the target, not from what was just written: this is the proof.
	const restored = await readDatabase(url, oldSchemas.map((m) => m.to));
	const expectedFiles = uploadEntries(manifest);
	const mismatches: Mismatch[] = [...compareTables(manifest.database.tables, restored.tables), ...compareFiles(expectedFiles, await hashTree(uploadsDir))];
	if (mismatches.length) {
		const kept = oldSchemas.length ? `\nThe earlier data is kept in the schemas ${oldSchemas.map((m) => m.to).join(', ')}.` : '';
		throw new RestoreError(`The restored data does not match the backup:\n${describeMismatches(mismatches)}${kept}`, false);
	}
	await dropSchemas(url, oldSchemas);
	const tables = Object.values(manifest.database.tables);
	return {
		manifest,
		tables: tables.length,
		rows: tables.reduce((n, t) => n + t.rows, 0),
		files: expectedFiles.length,
		bytes: expectedFiles.reduce((n, f) => n + f.size, 0),
		movedAside,
		ms: Date.now() - started,
	};
}
