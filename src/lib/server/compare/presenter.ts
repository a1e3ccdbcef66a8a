import type { ConditionCheck, Photo, PhotoComparison, User } from '../models/index.ts';
import type { ComparisonListItem, ComparisonView, PersonRef } from '../../compare/view.ts';
import { comparedDate } from './comparable.ts';

/** A saved comparison as the API shows it, loaded with its creator and last editor. */
export type LoadedComparison = PhotoComparison & { creator?: User; updater?: User };
/** …and, for the list, its photos with their checks. */
type DatedPhoto = Photo & { check: ConditionCheck | null };
export type ListedComparison = LoadedComparison & { before: DatedPhoto; after: DatedPhoto };

const person = (id: string, u: User | undefined): PersonRef => ({ id, name: u?.name ?? '' });

export function comparisonView(c: LoadedComparison): ComparisonView {
	return {
		id: c.id,
		specimenId: c.specimenId,
		beforePhotoId: c.beforePhotoId,
		afterPhotoId: c.afterPhotoId,
		model: c.model,
		controlPoints: c.controlPoints,
		transform: c.transform,
		note: c.note,
		summary: c.summary,
		version: c.version,
		createdBy: person(c.createdBy, c.creator),
		updatedBy: person(c.updatedBy, c.updater),
		createdAt: c.createdAt.toISOString(),
		updatedAt: c.updatedAt.toISOString(),
	};
}

export function comparisonListItem(c: ListedComparison): ComparisonListItem {
	return {
		id: c.id,
		beforePhotoId: c.beforePhotoId,
		afterPhotoId: c.afterPhotoId,
		beforeDate: comparedDate({ photo: c.before, check: c.before.check }),
		afterDate: comparedDate({ photo: c.after, check: c.after.check }),
		model: c.model,
		counts: c.summary.counts,
		createdBy: person(c.createdBy, c.creator),
		updatedAt: c.updatedAt.toISOString(),
	};
}
