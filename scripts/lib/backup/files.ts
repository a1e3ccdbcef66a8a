import fs from 'node:fs';
import fsp from 'node:fs/promises';
import path from 'node:path';
import { fsyncDir, fsyncFile, sha256File } from '../../../src/lib/server/photos/storage.ts';
import type { FileEntry } from './manifest.ts';

/**
 * File work for backup and restore: list a folder, copy it with a hash of every copy, hash it in
 * place. Paths in the results are relative and '/'-separated, as the manifest keeps them.
 */
export class BackupFileError extends Error {
	override name = 'BackupFileError';
}

const toPosix = (p: string) => p.split(path.sep).join('/');

/** The placeholder git keeps so that uploads/ exists in a clone: part of the source, not data. */
const PLACEHOLDER = '.gitkeep';

/** Every regular file below root (relative paths, sorted); a missing root has none. */
export async function listFiles(root: string): Promise<string[]> {
	const entries = await fsp.readdir(root, { withFileTypes: true, recursive: true }).catch((err: NodeJS.ErrnoException) => {
		if (err.code === 'ENOENT') return [];
		throw err;
	});
	const out: string[] = [];
	for (const e of entries) {
		if (e.isDirectory()) continue;
		const rel = toPosix(path.relative(root, path.join(e.parentPath, e.name)));
		if (rel === PLACEHOLDER) continue;
		// The app never writes links or devices here; following one could copy something from outside.
		if (!e.isFile()) throw new BackupFileError(`${path.join(root, rel)} is not a regular file or folder; move it away and retry`);
		out.push(rel);
	}
	return out.sort();
}

/** Whether `inner` is `outer` or lies below it (both absolute). */
export function isWithin(outer: string, inner: string): boolean {
	const rel = path.relative(outer, inner);
	return rel === '' || (rel !== '..' && !rel.startsWith(`..${path.sep}`) && !path.isAbsolute(rel));
}

/** Whether a folder is absent or holds no files (empty subfolders, as ensureDirs makes, do not count). */
export async function hasNoFiles(root: string): Promise<boolean> {
	return (await listFiles(root)).length === 0;
}

async function entryOf(file: string, rel: string): Promise<FileEntry> {
	const { size } = await fsp.stat(file);
	return { path: rel, size, sha256: await sha256File(file) };
}

/** Hashes every file below root, as it is on disk now. */
export async function hashTree(root: string, prefix = ''): Promise<FileEntry[]> {
	const out: FileEntry[] = [];
	for (const rel of await listFiles(root)) out.push(await entryOf(path.join(root, rel), prefix + rel));
	return out;
}

export interface CopyResult {
	files: FileEntry[];
	/** Listed but gone before the copy (only when vanishedOk). */
	vanished: string[];
}

/**
 * Copies `from` into `to` (which must not hold those files yet) and hashes each copy, not the
 * original, so the hash describes what the backup really holds even if the original changes under
 * us. Every file and then every folder is fsynced before the caller writes anything that says the
 * copy is complete. With `vanishedOk`, a file deleted between the listing and its copy is reported
 * instead of failing: the app removes tus leftovers and replaced derivative sets while it runs.
 */
export async function copyTree(from: string, to: string, { prefix = '', vanishedOk = false } = {}): Promise<CopyResult> {
	const result: CopyResult = { files: [], vanished: [] };
	const folders = new Set<string>([to]);
	await fsp.mkdir(to, { recursive: true });
	for (const rel of await listFiles(from)) {
		const dest = path.join(to, rel);
		await fsp.mkdir(path.dirname(dest), { recursive: true });
		for (let d = path.dirname(dest); d.startsWith(to) && !folders.has(d); d = path.dirname(d)) folders.add(d);
		try {
			await fsp.copyFile(path.join(from, rel), dest, fs.constants.COPYFILE_EXCL);
		} catch (err) {
			if (vanishedOk && (err as NodeJS.ErrnoException).code === 'ENOENT') {
				result.vanished.push(prefix + rel);
				continue;
			}
			throw err;
		}
		await fsyncFile(dest);
		result.files.push(await entryOf(dest, prefix + rel));
	}
	// Deepest first, so each folder is synced after the entries inside it.
	for (const d of [...folders].sort((a, b) => b.length - a.length)) await fsyncDir(d);
	return result;
}

/** Writes a small file durably under a temporary name and renames it into place. */
export async function writeFileDurably(file: string, text: string): Promise<void> {
	const tmp = `${file}.part`;
	await fsp.writeFile(tmp, text, { flag: 'wx', mode: 0o600 });
	await fsyncFile(tmp);
	await fsp.rename(tmp, file);
	await fsyncDir(path.dirname(file));
}
