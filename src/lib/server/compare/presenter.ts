import type { ConditionCheck, Photo, PhotoComparison, User } from '../models/index.ts';
import type { ComparisonListItem, ComparisonView, PersonRef } from '../../compare/view.ts';

/** A saved comparison as the API shows it, loaded with its creator and last editor. */
export type LoadedComparison = PhotoComparison & { creator?: User; updater?: User };
/** …and, for the list, its photos' checks. */
export type ListedComparison = LoadedComparison & { before?: Photo & { check?: ConditionCheck | null }; after?: Photo & { check?: ConditionCheck | null } };

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
		beforeCheckedOn: c.before?.check?.checkedOn ?? null,
		afterCheckedOn: c.after?.check?.checkedOn ?? null,
		model: c.model,
		counts: c.summary.counts,
		createdBy: person(c.createdBy, c.creator),
		updatedAt: c.updatedAt.toISOString(),
	};
}
