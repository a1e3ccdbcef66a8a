import fsp from 'node:fs/promises';
import path from 'node:path';
import { Op } from 'sequelize';
import { PhotoUpload } from '../models/index.ts';
import { audit } from '../audit.ts';
import { metaFromTus, UploadMetaSchema } from '../../photos/schema.ts';
import { listIncoming, readTusInfo, receivedBytes, removeIncoming } from './incoming.ts';
import { enqueueIngest } from './queue.ts';
import { finishUpload } from './uploads.ts';
import { dirs, removeQuietly, UUID } from './storage.ts';

/**
 * The reconciler: compares incoming/ with the upload records and mends what a crash left behind.
 * - bytes complete on disk but never queued (the app died between the last byte and the queue, or
 *   the queue was down): queued now;
 * - bytes complete with no record at all (the record was lost with a restored database): recorded
 *   from the metadata tus kept beside them, which names the uploader the server saw;
 * - either of these for a check that has since been submitted or approved: refused, as tus would
 *   have refused it (finishUpload), and removed;
 * - leftovers of uploads already recorded or refused: removed;
 * - unfinished uploads nobody has touched for a week: expired and removed;
 * - half-made derivative sets in work/ left by a run that died: removed.
 * It runs when the worker starts and every few minutes after.
 */
export const EXPIRE_AFTER_DAYS = 7;
/**
 * A finished upload's job was queued when its last byte came in (and claiming it for processing
 * touches the record again): only one left waiting longer than this is taken to have lost its job.
 * Queuing every finished upload on every pass would give each one a second job.
 */
export const STALE_AFTER_MINUTES = 10;

/** A half-made derivative set older than this belongs to a run that died. */
export const WORK_STALE_MINUTES = 60;

export interface ReconcileReport {
	staleWork: string[];
	queued: string[];
	recovered: string[];
	refused: string[];
	cleaned: string[];
	expired: string[];
	unreadable: string[];
}

export async function reconcile(now = new Date(), enqueue: (id: string) => Promise<void> = enqueueIngest): Promise<ReconcileReport> {
	const report: ReconcileReport = { staleWork: [], queued: [], recovered: [], refused: [], cleaned: [], expired: [], unreadable: [] };
	report.staleWork = await removeStaleWork(now);
	const expiredBefore = new Date(now.getTime() - EXPIRE_AFTER_DAYS * 86_400_000);
	const staleBefore = new Date(now.getTime() - STALE_AFTER_MINUTES * 60_000);
	for (const id of await listIncoming()) {
		const received = await receivedBytes(id);
		if (received === null) continue;
		let row = await PhotoUpload.findByPk(id);
		if (!row) {
			const info = await readTusInfo(id);
			row = info ? await recover(id, info.size, info.metadata) : null;
			if (!row) {
				report.unreadable.push(id);
				continue;
			}
			report.recovered.push(id);
		}
		if (row.state === 'recorded' || row.state === 'refused' || row.state === 'quarantined') {
			await removeIncoming(id);
			report.cleaned.push(id);
			continue;
		}
		if (received >= row.declaredSize) {
			if (!row.finishedAt) {
				const finished = await finishUpload(id, now);
				if (!finished.ok) {
					await removeIncoming(id);
					report.refused.push(id);
					continue;
				}
				// The tus finish hook got there first and queued it.
				if (!finished.first) continue;
			} else if (row.updatedAt >= staleBefore) {
				continue;
			}
			await enqueue(id);
			report.queued.push(id);
		} else if (row.updatedAt < expiredBefore) {
			await row.update({ state: 'refused', refusalCode: 'expired', reason: `The upload stopped at ${received} of ${row.declaredSize} bytes and was not resumed within ${EXPIRE_AFTER_DAYS} days.` });
			await removeIncoming(id);
			report.expired.push(id);
		}
	}
	// Records whose bytes finished but whose job was lost (a queue emptied by a restore, say).
	const stale = await PhotoUpload.findAll({ where: { state: 'receiving', finishedAt: { [Op.ne]: null }, updatedAt: { [Op.lt]: staleBefore } }, attributes: ['id'] });
	for (const { id } of stale) {
		if (!report.queued.includes(id) && (await receivedBytes(id)) !== null) {
			await enqueue(id);
			report.queued.push(id);
		}
	}
	return report;
}

async function removeStaleWork(now: Date): Promise<string[]> {
	const removed: string[] = [];
	for (const name of await fsp.readdir(dirs.work()).catch(() => [] as string[])) {
		const full = path.join(dirs.work(), name);
		const st = await fsp.stat(full).catch(() => null);
		if (st && now.getTime() - st.mtimeMs > WORK_STALE_MINUTES * 60_000) {
			await removeQuietly(full);
			removed.push(name);
		}
	}
	return removed;
}

async function recover(id: string, size: number | undefined, metadata: Record<string, string | null> | undefined): Promise<PhotoUpload | null> {
	const meta = UploadMetaSchema.safeParse(metaFromTus(metadata));
	const uploaderId = metadata?.uploaderId;
	if (!meta.success || !uploaderId || !UUID.test(uploaderId) || size === undefined || size <= 0) return null;
	try {
		const row = await PhotoUpload.create({
			id,
			specimenId: meta.data.specimenId,
			checkId: meta.data.checkId ?? null,
			view: meta.data.view,
			stage: meta.data.stage,
			fileName: meta.data.filename,
			declaredType: meta.data.filetype ?? null,
			declaredSize: size,
			clientSha256: meta.data.sha256 ?? null,
			uploaderId,
			refusalCode: null,
			reason: null,
			photoId: null,
			finishedAt: null,
		});
		await audit({ action: 'photo.upload-recovered', entityType: 'photo_upload', entityId: id, actorId: uploaderId, after: { fileName: meta.data.filename, size } });
		return row;
	} catch {
		// The specimen or the uploader no longer exists: nothing to attach it to.
		return null;
	}
}
