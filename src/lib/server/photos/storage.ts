import fs from 'node:fs';
import fsp from 'node:fs/promises';
import path from 'node:path';
import crypto from 'node:crypto';
import { config } from '../config.ts';

/**
 * The uploads folder and the file operations that keep it safe. Layout (all under
 * MENISCUS_UPLOADS_DIR, never served directly):
 *   incoming/<uploadId>(.json)          tus's FileStore: bytes as they arrive, and their metadata
 *   masters/<ab>/<photoId>.<ext>       the original, byte for byte, read-only
 *   derivatives/<photoId>/<setId>/     thumbnail.jpg, display.jpg, tiles/ (IIIF Image API 3)
 *   quarantine/<uploadId>(.json)       files kept aside with the reason (e.g. a hash mismatch)
 *   work/                              half-made derivative sets; renamed into place when complete
 * Every file that matters is fsynced, and its folder too, before the database says it exists.
 */
export function uploadsRoot(): string {
	return config().MENISCUS_UPLOADS_DIR;
}

export const dirs = {
	incoming: () => path.join(uploadsRoot(), 'incoming'),
	masters: () => path.join(uploadsRoot(), 'masters'),
	derivatives: () => path.join(uploadsRoot(), 'derivatives'),
	quarantine: () => path.join(uploadsRoot(), 'quarantine'),
	work: () => path.join(uploadsRoot(), 'work'),
};

export function ensureDirs(): void {
	let made = false;
	for (const d of Object.values(dirs)) made = fs.mkdirSync(d(), { recursive: true }) !== undefined || made;
	// New folders are new entries in the root (and a new root in its parent): synced, as mkdirDurably does.
	if (made) for (const d of [uploadsRoot(), path.dirname(uploadsRoot())]) fsyncDirSync(d);
}

function fsyncDirSync(dir: string): void {
	const fd = fs.openSync(dir, 'r');
	try {
		fs.fsyncSync(fd);
	} catch (err) {
		if ((err as NodeJS.ErrnoException).code !== 'EINVAL') throw err;
	} finally {
		fs.closeSync(fd);
	}
}

/** An id that names a file: tus ids and our set ids are hex; anything else never reaches the disk. */
export const SAFE_ID = /^[0-9a-f]{16,64}$/;
export const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

/** Joins a stored relative path to the root and refuses anything that would leave it. */
export function resolveStored(relative: string): string {
	const root = uploadsRoot();
	const full = path.resolve(root, relative);
	if (full !== root && !full.startsWith(root + path.sep)) throw new Error(`stored path leaves the uploads folder: ${relative}`);
	return full;
}

export const relativeToRoot = (full: string) => path.relative(uploadsRoot(), full);

export async function fsyncFile(file: string): Promise<void> {
	const h = await fsp.open(file, 'r');
	try {
		await h.sync();
	} finally {
		await h.close();
	}
}

/** A rename or link is durable only once the folder holding it is synced. */
export async function fsyncDir(dir: string): Promise<void> {
	const h = await fsp.open(dir, 'r');
	try {
		await h.sync();
	} catch (err) {
		// Some filesystems refuse fsync on a directory; the data itself is already synced.
		if ((err as NodeJS.ErrnoException).code !== 'EINVAL') throw err;
	} finally {
		await h.close();
	}
}

/**
 * mkdir -p, durably: a folder made here is itself a new entry in its parent, which must be synced
 * for the folder (and so everything later placed in it) to survive a power cut (fsync(2)).
 */
export async function mkdirDurably(dir: string): Promise<void> {
	const first = await fsp.mkdir(dir, { recursive: true });
	if (first === undefined) return;
	for (let d = path.resolve(dir); ; d = path.dirname(d)) {
		await fsyncDir(path.dirname(d));
		if (d === path.resolve(first)) return;
	}
}

/** Streams a file through SHA-256 (hex). */
export async function sha256File(file: string): Promise<string> {
	const hash = crypto.createHash('sha256');
	for await (const chunk of fs.createReadStream(file, { highWaterMark: 1024 * 1024 })) hash.update(chunk as Buffer);
	return hash.digest('hex');
}

/**
 * Places `from` at `to` without copying when both are on one filesystem (a hard link), else by a
 * copy to a temporary name and a rename; never overwrites an existing `to`. The result is synced.
 */
export async function placeDurably(from: string, to: string): Promise<void> {
	await mkdirDurably(path.dirname(to));
	try {
		await fsp.link(from, to);
	} catch (err) {
		const code = (err as NodeJS.ErrnoException).code;
		if (code === 'EEXIST') throw err;
		if (code !== 'EXDEV' && code !== 'EPERM' && code !== 'ENOTSUP') throw err;
		const tmp = `${to}.part-${crypto.randomBytes(4).toString('hex')}`;
		await fsp.copyFile(from, tmp, fs.constants.COPYFILE_EXCL);
		await fsyncFile(tmp);
		await fsp.link(tmp, to);
		await fsp.unlink(tmp);
	}
	await fsyncFile(to);
	await fsyncDir(path.dirname(to));
}

export async function readSlice(file: string, start: number, length: number): Promise<Uint8Array> {
	const h = await fsp.open(file, 'r');
	try {
		const buf = Buffer.alloc(length);
		const { bytesRead } = await h.read(buf, 0, length, start);
		return buf.subarray(0, bytesRead);
	} finally {
		await h.close();
	}
}

export async function removeQuietly(p: string): Promise<void> {
	await fsp.rm(p, { recursive: true, force: true }).catch(() => {});
}

export const newSetId = () => crypto.randomBytes(12).toString('hex');

export const masterExtension: Record<string, string> = { 'image/jpeg': 'jpg', 'image/png': 'png', 'image/tiff': 'tif', 'image/webp': 'webp' };
