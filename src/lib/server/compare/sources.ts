import { Specimen } from '../models/index.ts';
import type { SignedInUser } from '../auth/lucia.ts';
import type { ComparisonSourcePhoto, ComparisonSources } from '../../compare/view.ts';
import { comparablePhotos, comparedDate, levelMmOf, newestFirst, type Comparable } from './comparable.ts';
import { CompareError } from './error.ts';

/**
 * What the comparison page offers to compare: every ready photograph of one specimen, newest
 * first, each with its check, its display copy's size and its current mark layer, so the island
 * can run the same analysis the server runs on save. Every signed-in role may compare.
 */
export function sourcePhoto(c: Comparable): ComparisonSourcePhoto {
	const { photo: p, check } = c;
	const base = `/api/photos/${p.id}`;
	return {
		id: p.id,
		width: p.width,
		height: p.height,
		view: p.view,
		stage: p.stage,
		capturedAt: p.capturedAt?.toISOString() ?? null,
		date: comparedDate(c),
		urls: { display: `${base}/display`, thumbnail: `${base}/thumbnail` },
		display: { width: c.display.width, height: c.display.height },
		check: check
			? { id: check.id, checkedOn: check.checkedOn, status: check.state, examinerId: check.examinerId, examinerName: check.examiner?.name ?? '', levelMm: levelMmOf(check) }
			: null,
		layer: { layer: c.layer, version: c.layerVersion },
	};
}

// `_user`: the answer is the same for every role today; kept so a rule per role has its place.
export async function comparisonSources(specimenId: string, _user: SignedInUser): Promise<ComparisonSources> {
	const specimen = await Specimen.findByPk(specimenId, { attributes: ['id', 'objectNumber', 'title'] });
	if (!specimen) throw new CompareError(404, 'No such specimen.');
	const photos = (await comparablePhotos({ specimenId })).sort(newestFirst);
	return { specimen: { id: specimen.id, objectNumber: specimen.objectNumber, title: specimen.title }, photos: photos.map(sourcePhoto) };
}
