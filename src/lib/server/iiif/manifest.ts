import { Op } from 'sequelize';
import { PhotoDerivative, User } from '../models/index.ts';
import { getSpecimen } from '../specimens/service.ts';
import { comparablePhotos, newestFirst, comparedDate, type Comparable } from '../compare/comparable.ts';
import { annotationPageId, buildManifest, canvasId, PRESENTATION_CONTEXT, type Manifest } from '../../iiif/manifest.ts';
import { exportAnnotations } from '../../marks/annotation.ts';
import { LABELS } from '../../specimen/vocabulary.ts';
import { CHECK_LABELS, type CheckState } from '../../check/vocabulary.ts';
import { PHOTO_LABELS } from '../../photos/vocabulary.ts';

/**
 * The IIIF manifest of one specimen and the mark pages its canvases reference. Ready photographs
 * are those a comparison may use (comparable.ts: display copy and thumbnail in place).
 */
const photoBase = (origin: string, photoId: string) => `${origin}/api/photos/${photoId}`;

export async function specimenManifest(specimenId: string, manifestUrl: string, origin: string): Promise<Manifest | null> {
	const s = await getSpecimen(specimenId);
	if (!s) return null;
	const photos = (await comparablePhotos({ specimenId })).sort((a, b) => newestFirst(b, a));
	const tiled = new Set(
		(await PhotoDerivative.findAll({ attributes: ['photoId', 'setId'], where: { kind: 'tiles', photoId: { [Op.in]: photos.map((p) => p.photo.id) } } }))
			.filter((d) => photos.some((p) => p.photo.id === d.photoId && p.photo.derivativeSet === d.setId))
			.map((d) => d.photoId),
	);
	return buildManifest({
		url: manifestUrl,
		title: s.title,
		objectNumber: s.objectNumber,
		summary: s.description || `${s.objectNumber}, photographed at its condition checks.`,
		metadata: [
			['Object number', s.objectNumber],
			['Department', s.department],
			['Preservative', `${LABELS.preservative[s.preservativeKind]}${s.preservativeRecorded ? ` (recorded as “${s.preservativeRecorded}”)` : ''}`],
			['Container', `${LABELS.shape[s.containerShape]}, ${LABELS.material[s.containerMaterial]}, ${LABELS.closure[s.closureType]}, seal: ${LABELS.seal[s.sealType]}`],
			['Location', s.storageLocation ? `${s.storageLocation.code} (${s.storageLocation.name})` : ''],
		],
		canvases: photos.map((p) => ({
			photoId: p.photo.id,
			width: p.photo.width,
			height: p.photo.height,
			label: canvasLabel(p),
			image: { url: `${photoBase(origin, p.photo.id)}/display`, width: p.display.width, height: p.display.height },
			service: tiled.has(p.photo.id) ? `${photoBase(origin, p.photo.id)}/tiles` : null,
		})),
	});
}

function canvasLabel(p: Comparable): string {
	const what = `${PHOTO_LABELS.view[p.photo.view]}, ${PHOTO_LABELS.stage[p.photo.stage].toLowerCase()}`;
	return p.check ? `${comparedDate(p)} check (${CHECK_LABELS.state[p.check.state as CheckState].toLowerCase()}): ${what}` : `${comparedDate(p)}, outside a check: ${what}`;
}

/** The marks of one photo of the specimen as an AnnotationPage targeting its canvas; null if not its photo. */
export async function manifestAnnotations(specimenId: string, photoId: string, manifestUrl: string) {
	const [p] = await comparablePhotos({ specimenId, id: photoId });
	if (!p) return null;
	const authors = new Map((await User.findAll({ attributes: ['id', 'name'], where: { id: [...new Set(p.layer.marks.map((m) => m.authorId))] } })).map((u) => [u.id, u.name]));
	const pageId = annotationPageId(manifestUrl, photoId);
	// Mark ids are fragments of the page, so each resolves to the page that holds it.
	const page = exportAnnotations(p.layer, { imageId: canvasId(manifestUrl, photoId), width: p.photo.width, height: p.photo.height, creatorName: (a) => authors.get(a), idBase: `${pageId}#marks` });
	return { ...page, '@context': [...page['@context'], PRESENTATION_CONTEXT], id: pageId };
}
