import { Op, type Transaction, type WhereOptions } from 'sequelize';
import { ConditionCheck, Photo, PhotoDerivative, PhotoMarkLayer, User } from '../models/index.ts';
import { emptyLayer, type MarkLayer } from '../../marks/schema.ts';
import { migrateLayer } from '../../marks/migrate.ts';
import type { ComparedPhoto } from '../../compare/analysis.ts';

/**
 * The photographs a comparison can use, with everything the comparison needs of each: its check
 * (date, state, examiner, recorded fluid level), its display copy and its current mark layer.
 * Only ready photographs count: those whose current derivative set has its display copy and
 * thumbnail (the pipeline writes a photo's row once they are in place, but a set being remade
 * may briefly lack them).
 */
export type LoadedCheck = ConditionCheck & { examiner?: User };
type LoadedPhoto = Photo & { check: LoadedCheck | null; derivatives: PhotoDerivative[] };

export interface Comparable {
	photo: Photo;
	check: LoadedCheck | null;
	display: PhotoDerivative;
	layer: MarkLayer;
	layerVersion: number;
}

export async function comparablePhotos(where: WhereOptions<Photo>, transaction?: Transaction): Promise<Comparable[]> {
	const rows = (await Photo.findAll({
		where,
		include: [
			{ model: ConditionCheck, as: 'check', attributes: ['id', 'state', 'checkedOn', 'examinerId', 'fluid'], include: [{ model: User, as: 'examiner', attributes: ['id', 'name'] }] },
			{ model: PhotoDerivative, as: 'derivatives', where: { kind: { [Op.in]: ['display', 'thumbnail'] } }, required: false },
		],
		transaction,
	})) as LoadedPhoto[];
	const ready = rows.flatMap((p) => {
		const current = p.derivatives.filter((d) => d.setId === p.derivativeSet);
		const display = current.find((d) => d.kind === 'display');
		return display && current.some((d) => d.kind === 'thumbnail') ? [{ photo: p, check: p.check, display }] : [];
	});
	const layers = new Map(
		(await PhotoMarkLayer.findAll({ where: { photoId: ready.map((r) => r.photo.id) }, transaction })).map((l) => [l.photoId, l]),
	);
	return ready.map((r) => {
		const row = layers.get(r.photo.id);
		// Stored layers of older schema versions are brought forward on reading, as the marks API does.
		return { ...r, layer: row ? migrateLayer(row.layer) : emptyLayer(), layerVersion: row?.version ?? 0 };
	});
}

/**
 * The day a photograph is dated by in a comparison: its check's, else the capture instant's UTC
 * day (the rule the compare island applies to what it shows, so the summary it shows and the one
 * stored agree), else the upload's for a photograph whose camera recorded no time.
 */
export function comparedDate(p: Pick<Comparable, 'photo' | 'check'>): string {
	if (p.check) return p.check.checkedOn;
	return (p.photo.capturedAt ?? p.photo.uploadedAt).toISOString().slice(0, 10);
}

/** The fluid level recorded at the photo's check, mm above the inner base. */
export const levelMmOf = (check: LoadedCheck | null): number | null => check?.fluid?.levelMm ?? null;

/** The photograph as analysePair takes it. */
export function comparedPhoto(p: Comparable): ComparedPhoto {
	return { width: p.photo.width, height: p.photo.height, layer: p.layer, date: comparedDate(p), levelMm: levelMmOf(p.check) };
}

/** Newest first: by the comparison date, then capture time, then when recorded. */
export function newestFirst(a: Comparable, b: Comparable): number {
	const byDate = comparedDate(b).localeCompare(comparedDate(a));
	if (byDate) return byDate;
	const time = (p: Comparable) => p.photo.capturedAt?.getTime() ?? -Infinity;
	return time(b) - time(a) || b.photo.createdAt.getTime() - a.photo.createdAt.getTime();
}
