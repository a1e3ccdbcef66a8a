import { UniqueConstraintError, type Transaction } from 'sequelize';
import { db } from '../db.ts';
import { ConditionCheck, Photo, PhotoMarkLayer } from '../models/index.ts';
import { audit } from '../audit.ts';
import { vocabulary } from '../checks/settings.ts';
import type { SignedInUser } from '../auth/lucia.ts';
import { emptyLayer, type MarkLayer } from '../../marks/schema.ts';
import { migrateLayer } from '../../marks/migrate.ts';
import { changedMarks, checkLayerChange, checkMarkContent, layerMode, type LayerMode } from '../../marks/policy.ts';
import type { CheckState } from '../../check/vocabulary.ts';

/**
 * Reading and saving a photo's mark layer. A save names the version it started from and replaces
 * the whole layer in one transaction with its audit event; if someone saved in between, nothing is
 * written and the caller gets the layer as it now is (409), so the canvas can merge or reload
 * without losing what was drawn.
 */
export class MarkError extends Error {
	constructor(
		readonly status: 400 | 403 | 404 | 409,
		message: string,
		readonly current?: LayerAnswer,
	) {
		super(message);
	}
}

export interface LayerAnswer {
	photoId: string;
	layer: MarkLayer;
	version: number;
	updatedAt: string | null;
	updatedBy: string | null;
	mode: LayerMode;
	reason: string | null;
	photo: { width: number; height: number; checkId: string | null; checkState: CheckState | null };
}

async function photoOf(photoId: string, transaction?: Transaction) {
	const photo = await Photo.findByPk(photoId, { attributes: ['id', 'width', 'height', 'checkId'], transaction });
	if (!photo) throw new MarkError(404, 'No such photograph.');
	// A shared lock on the check: an approval waits for a save in progress, and a save sees an approval.
	const check = photo.checkId ? await ConditionCheck.findByPk(photo.checkId, { attributes: ['id', 'state'], transaction, ...(transaction ? { lock: transaction.LOCK.SHARE } : {}) }) : null;
	return { photo, checkState: (check?.state ?? null) as CheckState | null };
}

function answer(photoId: string, row: PhotoMarkLayer | null, found: Awaited<ReturnType<typeof photoOf>>, user: SignedInUser): LayerAnswer {
	const { mode, reason } = layerMode(user.role, found.checkState);
	return {
		photoId,
		// Stored layers of older schema versions are brought forward on reading.
		layer: row ? migrateLayer(row.layer) : emptyLayer(),
		version: row?.version ?? 0,
		updatedAt: row?.updatedAt.toISOString() ?? null,
		updatedBy: row?.updatedBy ?? null,
		mode,
		reason,
		photo: { width: found.photo.width, height: found.photo.height, checkId: found.photo.checkId, checkState: found.checkState },
	};
}

export async function getLayer(photoId: string, user: SignedInUser): Promise<LayerAnswer> {
	const found = await photoOf(photoId);
	return answer(photoId, await PhotoMarkLayer.findByPk(photoId), found, user);
}

export async function saveLayer(photoId: string, user: SignedInUser, version: number, layer: MarkLayer, clientAddress: string | null): Promise<LayerAnswer> {
	// Read before the transaction: inside it, a second connection per save could exhaust the pool
	// while twenty savers queue on the row lock.
	const terms = await vocabulary();
	try {
		return await db().transaction(async (transaction) => {
			const found = await photoOf(photoId, transaction);
			const row = await PhotoMarkLayer.findByPk(photoId, { transaction, lock: transaction.LOCK.UPDATE });
			const current = answer(photoId, row, found, user);
			if (current.mode === 'read') throw new MarkError(403, current.reason ?? 'You may not change these marks.');
			if (current.version !== version) throw new MarkError(409, 'Someone saved these marks after you opened them; yours are kept on screen. Merge them with the saved ones or reload.', current);
			const verdict = checkLayerChange(current.layer, layer, { id: user.id, mode: current.mode });
			if (!verdict.ok) throw new MarkError(verdict.status, verdict.reason);
			const content = checkMarkContent(changedMarks(current.layer, layer), found.photo, terms);
			if (!content.ok) throw new MarkError(content.status, content.reason);
			const next = version + 1;
			if (row) {
				row.layer = layer;
				row.markCount = layer.marks.length;
				row.version = next;
				row.updatedBy = user.id;
				row.changed('layer', true);
				await row.save({ transaction });
			} else {
				await PhotoMarkLayer.create({ photoId, layer, markCount: layer.marks.length, version: next, updatedBy: user.id }, { transaction });
			}
			const before = new Set(current.layer.marks.map((m) => m.id));
			const after = new Set(layer.marks.map((m) => m.id));
			await audit(
				{
					action: 'marks.saved',
					entityType: 'photo',
					entityId: photoId,
					actorId: user.id,
					clientAddress,
					before: { version, marks: before.size, comments: current.layer.comments.length },
					after: {
						version: next,
						marks: after.size,
						comments: layer.comments.length,
						added: [...after].filter((i) => !before.has(i)).length,
						removed: [...before].filter((i) => !after.has(i)).length,
						changed: changedMarks(current.layer, layer).filter((m) => before.has(m.id)).length,
					},
				},
				transaction,
			);
			return { ...current, layer, version: next, updatedAt: new Date().toISOString(), updatedBy: user.id };
		});
	} catch (err) {
		// Two first saves at once: the loser's insert meets the winner's row.
		if (err instanceof UniqueConstraintError) throw new MarkError(409, 'Someone saved these marks at the same moment; reload to see theirs.', await getLayer(photoId, user));
		if (err instanceof Error && /approved check cannot be changed/.test(err.message)) throw new MarkError(403, 'The check was approved meanwhile; its marks no longer change.');
		throw err;
	}
}
