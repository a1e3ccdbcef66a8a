import { ConditionCheck, Photo, PhotoDerivative, Specimen, User, type DerivativeKind } from '../models/index.ts';
import type { SignedInUser } from '../auth/lucia.ts';
import { mayDownloadOriginal } from '../../photos/access.ts';
import type { PhotoRecord } from '../../photos/view.ts';
import { resolveStored } from './storage.ts';

/**
 * Reading recorded photographs: one with its derivatives for the photo page and the file routes,
 * and the lists of a specimen and of a check. Every signed-in role sees photographs; the GPS
 * position and serial numbers only reach those who may download the master that holds them.
 */
const include = [
	{ model: Specimen, as: 'specimen', attributes: ['id', 'objectNumber', 'title'] },
	{ model: ConditionCheck, as: 'check', attributes: ['id', 'state', 'checkedOn'] },
	{ model: User, as: 'uploader', attributes: ['id', 'name'] },
	{ model: PhotoDerivative, as: 'derivatives' },
];

type Loaded = Photo & { specimen: Specimen; check: ConditionCheck | null; uploader: User; derivatives: PhotoDerivative[] };

export function photoRecord(p: Loaded, viewer: SignedInUser): PhotoRecord {
	const { private: secret, ...exif } = p.exif;
	const base = `/api/photos/${p.id}`;
	return {
		id: p.id,
		specimen: { id: p.specimen.id, objectNumber: p.specimen.objectNumber, title: p.specimen.title },
		check: p.check ? { id: p.check.id, state: p.check.state, checkedOn: p.check.checkedOn } : null,
		view: p.view,
		stage: p.stage,
		fileName: p.fileName,
		mediaType: p.mediaType,
		byteSize: p.byteSize,
		sha256: p.sha256,
		width: p.width,
		height: p.height,
		captured: { raw: p.capturedRaw, offset: p.capturedOffset, at: p.capturedAt?.toISOString() ?? null },
		camera: p.camera,
		lens: p.lens,
		exif: mayDownloadOriginal(viewer.role) ? { ...exif, private: secret } : exif,
		uploadedBy: { id: p.uploader.id, name: p.uploader.name },
		uploadedAt: p.uploadedAt.toISOString(),
		recordedAt: p.createdAt.toISOString(),
		urls: { thumbnail: `${base}/thumbnail`, display: `${base}/display`, tiles: `${base}/tiles/info.json`, original: mayDownloadOriginal(viewer.role) ? `${base}/original` : null, page: `/photos/${p.id}` },
		derivatives: p.derivatives.map((d) => ({ kind: d.kind, width: d.width, height: d.height, byteSize: d.byteSize })),
	};
}

export async function getPhoto(id: string): Promise<Loaded | null> {
	return (await Photo.findByPk(id, { include })) as Loaded | null;
}

export async function photoList(where: { specimenId: string } | { checkId: string }, viewer: SignedInUser): Promise<PhotoRecord[]> {
	const rows = (await Photo.findAll({ where, include, order: [['capturedAt', 'ASC NULLS LAST'], ['createdAt', 'ASC']] })) as Loaded[];
	return rows.map((p) => photoRecord(p, viewer));
}

/** The file of one derivative of the current set, resolved inside the uploads folder. */
export async function derivativeFile(photoId: string, kind: DerivativeKind): Promise<{ photo: Photo; derivative: PhotoDerivative; file: string } | null> {
	const photo = await Photo.findByPk(photoId, { attributes: ['id', 'derivativeSet', 'sha256'] });
	if (!photo) return null;
	const derivative = await PhotoDerivative.findOne({ where: { photoId, kind, setId: photo.derivativeSet } });
	if (!derivative) return null;
	return { photo, derivative, file: resolveStored(derivative.path) };
}
