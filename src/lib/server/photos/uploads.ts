import { Op, Transaction } from 'sequelize';
import { ConditionCheck, PhotoUpload, Specimen } from '../models/index.ts';
import type { SignedInUser } from '../auth/lucia.ts';
import { audit } from '../audit.ts';
import { db } from '../db.ts';
import { metaFromTus, UploadMetaSchema } from '../../photos/schema.ts';
import { checkTakesPhotos, mayUpload } from '../../photos/access.ts';
import { MAX_UPLOAD_BYTES, formatBytes } from '../../photos/limits.ts';
import { UPLOAD_STATE_LABELS, type UploadState } from '../../photos/vocabulary.ts';

/**
 * The upload records behind tus: created (after validation and the access check) when tus creates
 * an upload, consulted on every later request for it, and marked finished when the last byte is in.
 */
export class UploadRefused extends Error {
	constructor(
		readonly status: 400 | 403 | 404 | 409 | 413,
		message: string,
	) {
		super(message);
	}
}

export async function createUploadRecord(user: SignedInUser, uploadId: string, rawMeta: Record<string, string | null> | undefined, size: number | undefined): Promise<void> {
	if (size === undefined) throw new UploadRefused(400, 'Say the size of the file when the upload starts (Upload-Length); deferred lengths are not accepted.');
	if (size === 0) throw new UploadRefused(400, 'The file is empty (0 bytes).');
	if (size > MAX_UPLOAD_BYTES) throw new UploadRefused(413, `The file is ${formatBytes(size)}; the limit is ${formatBytes(MAX_UPLOAD_BYTES)}.`);
	const parsed = UploadMetaSchema.safeParse(metaFromTus(rawMeta));
	if (!parsed.success) throw new UploadRefused(400, parsed.error.issues.map((i) => i.message).join(' '));
	const meta = parsed.data;
	const specimen = await Specimen.findByPk(meta.specimenId, { attributes: ['id'] });
	let check: Parameters<typeof mayUpload>[1]['check'] = null;
	if (meta.checkId) {
		const c = await ConditionCheck.findByPk(meta.checkId, { attributes: ['id', 'state', 'specimenId'] });
		check = c ? { state: c.state, specimenMatches: c.specimenId === meta.specimenId } : 'missing';
	}
	const verdict = mayUpload(user.role, { specimenExists: specimen !== null, check });
	if (!verdict.ok) throw new UploadRefused(verdict.status, verdict.reason);
	await db().transaction(async (transaction) => {
		await PhotoUpload.create(
			{
				id: uploadId,
				specimenId: meta.specimenId,
				checkId: meta.checkId ?? null,
				view: meta.view,
				stage: meta.stage,
				fileName: meta.filename,
				declaredType: meta.filetype ?? null,
				declaredSize: size,
				clientSha256: meta.sha256 ?? null,
				uploaderId: user.id,
				refusalCode: null,
				reason: null,
				photoId: null,
				finishedAt: null,
			},
			{ transaction },
		);
		await audit({ action: 'photo.upload-started', entityType: 'photo_upload', entityId: uploadId, actorId: user.id, after: { fileName: meta.filename, size, specimenId: meta.specimenId, checkId: meta.checkId ?? null } }, transaction);
	});
}

/**
 * Only the person who started an upload (or an administrator) may continue, inspect or cancel it.
 * Someone else's upload gets the answer a missing one gets, so its address tells them nothing, and
 * the attempt is logged (ASVS 16.3.2): upload addresses are not guessed by accident.
 */
export async function uploadOf(user: SignedInUser, uploadId: string): Promise<PhotoUpload> {
	const u = await PhotoUpload.findByPk(uploadId);
	if (!u) throw new UploadRefused(404, 'No such upload.');
	if (u.uploaderId !== user.id && user.role !== 'admin') {
		await audit({ action: 'access.refused', entityType: 'photo_upload', entityId: uploadId, actorId: user.id, after: { reason: 'not-the-uploader' } });
		throw new UploadRefused(404, 'No such upload.');
	}
	return u;
}

/**
 * Before each HEAD and PATCH of an unfinished upload: bytes for a photo of a check are taken only
 * while the check still takes photographs (a draft or a returned check), so nobody sends a large
 * file that would be refused at the end. The upload itself is left as it is: once the check is
 * returned it can be resumed. The HEAD matters as much as the PATCH: a PATCH refused before its
 * body is read ends with the connection closed, which clients report as a network error and retry
 * with a HEAD, so the HEAD's refusal is what makes tus-js-client and Uppy stop and, trying to start
 * again, meet creation's refusal with its reason. 403, not 409: in tus a 409 to a PATCH means an
 * offset conflict, which clients retry, and retrying does not make this refusal go away.
 */
export async function assertMayContinue(upload: PhotoUpload): Promise<void> {
	// A finished upload has joined its check already; its HEAD must go on saying so (offset = length).
	if (!upload.checkId || upload.finishedAt) return;
	const check = await ConditionCheck.findByPk(upload.checkId, { attributes: ['id', 'state'] });
	const verdict = checkTakesPhotos(check?.state ?? null);
	if (!verdict.ok) throw new UploadRefused(403, verdict.reason);
}

/**
 * `first`: this call marked it finished. Only that caller queues the photo's job: the tus finish hook
 * and the reconciler can meet on one upload (its last byte in, the hook not yet done), and both
 * queuing gave it two jobs (seen in the L2 test: 33 jobs for 30 uploads).
 */
export type FinishOutcome = { ok: true; first: boolean } | { ok: false; reason: string };

/**
 * Marks an upload's bytes complete: the moment a photo of a check joins that check. The check's
 * row is read FOR SHARE, so a submission or approval running at the same time (an UPDATE of that
 * row) waits for this transaction or is seen by it: the photo either arrived while the check took
 * photographs or it is refused here, with its reason, and never recorded. Idempotent: called by
 * tus when the last byte is in and by the reconciler for bytes that were complete but never marked.
 */
export async function finishUpload(uploadId: string, at = new Date()): Promise<FinishOutcome> {
	return db().transaction(async (transaction) => {
		const upload = await PhotoUpload.findByPk(uploadId, { transaction, lock: Transaction.LOCK.UPDATE });
		if (!upload || upload.finishedAt) return { ok: true, first: false };
		if (upload.state === 'receiving' && upload.checkId) {
			const check = await ConditionCheck.findByPk(upload.checkId, { attributes: ['id', 'state'], transaction, lock: Transaction.LOCK.SHARE });
			const verdict = checkTakesPhotos(check?.state ?? null);
			if (!verdict.ok) {
				const reason = `${verdict.reason} The upload finished after that, so the file was not kept.`;
				await upload.update({ state: 'refused', refusalCode: 'check-closed', reason }, { transaction });
				await audit({ action: 'photo.refused', entityType: 'photo_upload', entityId: upload.id, actorId: upload.uploaderId, after: { fileName: upload.fileName, code: 'check-closed', reason, checkState: check?.state ?? null } }, transaction);
				return { ok: false, reason };
			}
		}
		await upload.update({ finishedAt: at }, { transaction });
		return { ok: true, first: true };
	});
}

export async function markCancelled(uploadId: string, user: SignedInUser): Promise<void> {
	await PhotoUpload.update({ state: 'refused', refusalCode: 'cancelled', reason: 'Cancelled by the uploader before it finished.' }, { where: { id: uploadId, state: 'receiving', finishedAt: null } });
	await audit({ action: 'photo.upload-cancelled', entityType: 'photo_upload', entityId: uploadId, actorId: user.id });
}

export interface UploadStatus {
	id: string;
	fileName: string;
	state: UploadState;
	label: string;
	finished: boolean;
	code: string | null;
	reason: string | null;
	photoId: string | null;
}

export async function uploadStatuses(user: SignedInUser, ids: string[]): Promise<UploadStatus[]> {
	const where = user.role === 'admin' ? { id: { [Op.in]: ids } } : { id: { [Op.in]: ids }, uploaderId: user.id };
	const rows = await PhotoUpload.findAll({ where });
	return rows.map((u) => ({
		id: u.id,
		fileName: u.fileName,
		state: u.state,
		label: u.state === 'receiving' && u.finishedAt ? 'Waiting to be checked' : UPLOAD_STATE_LABELS[u.state as UploadState],
		finished: u.finishedAt !== null,
		code: u.refusalCode,
		reason: u.reason,
		photoId: u.photoId,
	}));
}
