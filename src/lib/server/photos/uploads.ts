import { Op } from 'sequelize';
import { ConditionCheck, PhotoUpload, Specimen } from '../models/index.ts';
import type { SignedInUser } from '../auth/lucia.ts';
import { audit } from '../audit.ts';
import { db } from '../db.ts';
import { metaFromTus, UploadMetaSchema } from '../../photos/schema.ts';
import { mayUpload } from '../../photos/access.ts';
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

/** Only the person who started an upload (or an administrator) may continue, inspect or cancel it. */
export async function uploadOf(user: SignedInUser, uploadId: string): Promise<PhotoUpload> {
	const u = await PhotoUpload.findByPk(uploadId);
	if (!u || (u.uploaderId !== user.id && user.role !== 'admin')) throw new UploadRefused(404, 'No such upload.');
	return u;
}

export async function markFinished(uploadId: string): Promise<void> {
	await PhotoUpload.update({ finishedAt: new Date() }, { where: { id: uploadId, finishedAt: null } });
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
