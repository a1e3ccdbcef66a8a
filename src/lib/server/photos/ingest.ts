import crypto from 'node:crypto';
import fsp from 'node:fs/promises';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import { db } from '../db.ts';
import { Photo, PhotoDerivative, PhotoUpload } from '../models/index.ts';
import { audit } from '../audit.ts';
import { isDatabaseUnavailable } from '../dbErrors.ts';
import { cameraName, captureInstant } from '../../photos/exif.ts';
import { inspect, isDecodeError, makeDerivatives, readExif, shortError, type Refusal } from './pipeline.ts';
import { incomingFile, receivedBytes, removeIncoming } from './incoming.ts';
import { dirs, fsyncDir, fsyncFile, masterExtension, mkdirDurably, newSetId, placeDurably, relativeToRoot, removeQuietly, resolveStored, sha256File } from './storage.ts';

/**
 * Turns a finished upload into a recorded photograph, as a job that may run twice, crash anywhere
 * and be retried: claim the upload, check the bytes, hash the original, read its EXIF, make the
 * derivative set in a work folder, place the master (a hard link, never a re-encode) and rename the
 * set into place, all synced, and only then write the photo and derivative rows in one
 * transaction. A crash before the commit leaves files no row points to, which the next run reuses
 * or removes; a crash after it leaves only the incoming copy, removed on the next pass.
 */
export type IngestOutcome =
	| { state: 'recorded'; photoId: string }
	| { state: 'refused' | 'quarantined'; code: string; reason: string }
	| { state: 'skipped'; why: string };

/** A claim older than this is taken to belong to a worker that died. */
const LEASE_MINUTES = 20;

/** One photo id per upload, so a rerun after a crash finds the files the first run placed. */
export function photoIdFor(uploadId: string): string {
	const h = crypto.createHash('sha256').update(`meniscus-photo:${uploadId}`).digest('hex');
	// Shaped as an RFC 9562 version-8 (custom) UUID.
	return `${h.slice(0, 8)}-${h.slice(8, 12)}-8${h.slice(13, 16)}-${((parseInt(h.charAt(16), 16) & 0x3) | 0x8).toString(16)}${h.slice(17, 20)}-${h.slice(20, 32)}`;
}

async function claim(uploadId: string): Promise<boolean> {
	const rows = await db().query(
		`UPDATE photo_uploads SET state = 'processing', updated_at = now()
		 WHERE id = :id AND (state = 'receiving' OR (state = 'processing' AND updated_at < now() - interval '${LEASE_MINUTES} minutes'))
		 RETURNING id`,
		{ replacements: { id: uploadId }, type: QueryTypes.SELECT },
	);
	return rows.length === 1;
}

/** How long a failed job waits for the database to come back so it can hand its upload back. */
const RELEASE_PATIENCE_MS = 3 * 60_000;

/**
 * Hands a claimed upload back after a failure, for the job's retry to claim. If the failure was the
 * database going away (a crash, a restart: TESTPLAN F5, F6), the hand-back waits for it to return;
 * otherwise the upload would stay claimed until the lease ran out, 20 minutes, and pg-boss could not
 * record the failure either (so the retry would wait for the job's 30-minute expiry).
 */
async function release(uploadId: string): Promise<void> {
	const until = Date.now() + RELEASE_PATIENCE_MS;
	for (let wait = 250; ; wait = Math.min(wait * 2, 5_000)) {
		try {
			await PhotoUpload.update({ state: 'receiving' }, { where: { id: uploadId, state: 'processing' } });
			return;
		} catch (err) {
			if (!isDatabaseUnavailable(err) || Date.now() > until) throw err;
			await new Promise((r) => setTimeout(r, wait));
		}
	}
}

async function refuse(upload: PhotoUpload, r: Refusal): Promise<IngestOutcome> {
	await db().transaction(async (transaction) => {
		await upload.update({ state: 'refused', refusalCode: r.code, reason: r.reason }, { transaction });
		await audit({ action: 'photo.refused', entityType: 'photo_upload', entityId: upload.id, actorId: upload.uploaderId, after: { fileName: upload.fileName, code: r.code, reason: r.reason } }, transaction);
	});
	// A refused file is not evidence of anything and is not kept.
	await removeIncoming(upload.id);
	return { state: 'refused', code: r.code, reason: r.reason };
}

async function quarantine(upload: PhotoUpload, code: string, reason: string, facts: Record<string, unknown>): Promise<IngestOutcome> {
	const to = path.join(dirs.quarantine(), upload.id);
	await placeDurably(incomingFile(upload.id), to).catch((err) => {
		if ((err as NodeJS.ErrnoException).code !== 'EEXIST') throw err;
	});
	await fsp.writeFile(`${to}.json`, JSON.stringify({ uploadId: upload.id, code, reason, ...facts, at: new Date().toISOString() }, null, 2));
	await db().transaction(async (transaction) => {
		await upload.update({ state: 'quarantined', refusalCode: code, reason }, { transaction });
		await audit({ action: 'photo.quarantined', entityType: 'photo_upload', entityId: upload.id, actorId: upload.uploaderId, after: { fileName: upload.fileName, code, reason, ...facts } }, transaction);
	});
	await removeIncoming(upload.id);
	return { state: 'quarantined', code, reason };
}

export async function ingestUpload(uploadId: string): Promise<IngestOutcome> {
	const upload = await PhotoUpload.findByPk(uploadId);
	if (!upload) return { state: 'skipped', why: 'no such upload' };
	if (upload.state === 'recorded' && upload.photoId) {
		// Done before; only the incoming copy may be left over from a crash after the commit.
		await removeIncoming(uploadId);
		return { state: 'recorded', photoId: upload.photoId };
	}
	if (upload.state === 'refused' || upload.state === 'quarantined') return { state: upload.state, code: upload.refusalCode ?? '', reason: upload.reason ?? '' };
	const received = await receivedBytes(uploadId);
	if (received === null) return { state: 'skipped', why: 'the bytes are not in incoming/' };
	if (received < upload.declaredSize) return { state: 'skipped', why: `incomplete (${received} of ${upload.declaredSize} bytes)` };
	if (!(await claim(uploadId))) return { state: 'skipped', why: 'another worker has it' };
	try {
		return await processClaimed(await upload.reload());
	} catch (err) {
		await release(uploadId).catch(() => {});
		throw err;
	}
}

async function processClaimed(upload: PhotoUpload): Promise<IngestOutcome> {
	const file = incomingFile(upload.id);
	if ((await receivedBytes(upload.id)) !== upload.declaredSize) {
		return refuse(upload, { code: 'size-mismatch', reason: `The upload holds more bytes than the ${upload.declaredSize} it declared.` });
	}
	// The bytes came through tus's write stream, which does not sync; make them durable first.
	await fsyncFile(file);
	const found = await inspect(file);
	if (!found.ok) return refuse(upload, found.refusal);
	const sha256 = await sha256File(file);
	if (upload.clientSha256 && upload.clientSha256 !== sha256) {
		return quarantine(upload, 'hash-mismatch', `The file that arrived does not match the SHA-256 the uploader computed before sending (expected ${upload.clientSha256.slice(0, 12)}…, received ${sha256.slice(0, 12)}…); it is kept aside in quarantine and not recorded.`, { expected: upload.clientSha256, received: sha256 });
	}
	const exif = await readExif(file);
	const photoId = photoIdFor(upload.id);
	const setId = newSetId();
	const work = path.join(dirs.work(), setId);
	let derivatives: Awaited<ReturnType<typeof makeDerivatives>>;
	try {
		derivatives = await makeDerivatives(file, work);
	} catch (err) {
		if (isDecodeError(err)) return refuse(upload, { code: 'undecodable', reason: `The image cannot be decoded (${shortError(err)}); the file is damaged or incomplete.` });
		throw err;
	}
	await syncTree(work);
	// The master: the received bytes themselves, linked into place and made read-only.
	const master = path.join(dirs.masters(), photoId.slice(0, 2), `${photoId}.${masterExtension[found.mime]}`);
	try {
		await placeDurably(file, master);
	} catch (err) {
		if ((err as NodeJS.ErrnoException).code !== 'EEXIST') throw err;
		// Placed by an earlier run that crashed before its commit: it must be these very bytes.
		if ((await sha256File(master)) !== sha256) throw new Error(`master ${master} exists with other content`);
	}
	await fsp.chmod(master, 0o444);
	const setDir = path.join(dirs.derivatives(), photoId, setId);
	await mkdirDurably(path.dirname(setDir));
	await fsp.rename(work, setDir);
	await fsyncDir(path.dirname(setDir));
	const capturedAt = captureInstant(exif.capture.raw, exif.capture.offset);
	await db().transaction(async (transaction) => {
		await Photo.create(
			{
				id: photoId,
				uploadId: upload.id,
				specimenId: upload.specimenId,
				checkId: upload.checkId,
				view: upload.view,
				stage: upload.stage,
				fileName: upload.fileName,
				mediaType: found.mime,
				byteSize: upload.declaredSize,
				sha256,
				masterPath: relativeToRoot(master),
				width: found.width,
				height: found.height,
				orientation: found.orientation,
				capturedRaw: exif.capture.raw?.slice(0, 40) ?? null,
				capturedOffset: exif.capture.offset,
				capturedAt,
				camera: cameraName(exif),
				lens: exif.lens.model,
				exif,
				derivativeSet: setId,
				uploadedBy: upload.uploaderId,
				uploadedAt: upload.createdAt,
			},
			{ transaction },
		);
		await PhotoDerivative.bulkCreate(
			derivatives.map((d) => ({ photoId, kind: d.kind, setId, path: relativeToRoot(path.join(setDir, d.path)), mediaType: d.mediaType, width: d.width, height: d.height, byteSize: d.byteSize })),
			{ transaction },
		);
		await upload.update({ state: 'recorded', photoId, refusalCode: null, reason: null }, { transaction });
		// The first fixity check: the hash just computed from the bytes now in place.
		await db().query(`INSERT INTO photo_fixity_checks (photo_id, outcome, sha256_seen) VALUES (:photoId, 'match', :sha256)`, { replacements: { photoId, sha256 }, transaction });
		await audit({ action: 'photo.recorded', entityType: 'photo', entityId: photoId, actorId: upload.uploaderId, after: { fileName: upload.fileName, sha256, specimenId: upload.specimenId, checkId: upload.checkId, width: found.width, height: found.height } }, transaction);
	});
	await removeOtherSets(photoId, setId);
	await removeIncoming(upload.id);
	return { state: 'recorded', photoId };
}

/**
 * Makes a new derivative set for a recorded photo (after a change in how derivatives are made) and
 * swaps it in: rows and the pointer change in one transaction, then the old set is removed.
 */
export async function regenerateDerivatives(photoId: string): Promise<string> {
	const photo = await Photo.findByPk(photoId);
	if (!photo) throw new Error('No such photo.');
	const setId = newSetId();
	const work = path.join(dirs.work(), setId);
	const derivatives = await makeDerivatives(resolveStored(photo.masterPath), work);
	await syncTree(work);
	const setDir = path.join(dirs.derivatives(), photoId, setId);
	await mkdirDurably(path.dirname(setDir));
	await fsp.rename(work, setDir);
	await fsyncDir(path.dirname(setDir));
	await db().transaction(async (transaction) => {
		await PhotoDerivative.destroy({ where: { photoId }, transaction });
		await PhotoDerivative.bulkCreate(
			derivatives.map((d) => ({ photoId, kind: d.kind, setId, path: relativeToRoot(path.join(setDir, d.path)), mediaType: d.mediaType, width: d.width, height: d.height, byteSize: d.byteSize })),
			{ transaction },
		);
		photo.derivativeSet = setId;
		await photo.save({ transaction });
	});
	await removeOtherSets(photoId, setId);
	return setId;
}

async function removeOtherSets(photoId: string, keep: string): Promise<void> {
	const dir = path.join(dirs.derivatives(), photoId);
	for (const name of await fsp.readdir(dir).catch(() => [] as string[])) if (name !== keep) await removeQuietly(path.join(dir, name));
}

/** Syncs every file of a freshly written folder tree, then the folders, so a power cut keeps all or nothing. */
async function syncTree(dir: string): Promise<void> {
	const entries = await fsp.readdir(dir, { withFileTypes: true, recursive: true });
	const folders = new Set<string>([dir]);
	await Promise.all(
		entries.map(async (e) => {
			const full = path.join(e.parentPath, e.name);
			if (e.isDirectory()) folders.add(full);
			else await fsyncFile(full);
		}),
	);
	for (const f of folders) await fsyncDir(f);
}
