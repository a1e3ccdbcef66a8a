import type { FluidColour } from '../colour/index.ts';
import type { CheckState } from '../check/vocabulary.ts';
import type { MarkLayer } from '../marks/schema.ts';
import type { PhotoStage, PhotoView } from '../photos/vocabulary.ts';
import type { ComparisonSummary } from './analysis.ts';
import type { Matrix3 } from './registration.ts';
import type { ChangeClass } from './changes.ts';
import type { ControlPair, RegistrationModel } from './schema.ts';

/**
 * What the comparison API answers, for the island to type its queries with. Pixel sizes are of the
 * full-resolution upright photograph (the mark layers' space) unless named `display`.
 */
export interface ComparisonSourcePhoto {
	id: string;
	width: number;
	height: number;
	view: PhotoView;
	stage: PhotoStage;
	/** ISO 8601, as the photos API gives `captured.at`; null when the camera recorded no time. */
	capturedAt: string | null;
	/** The date a comparison dates this photograph by (analysis.ts ComparedPhoto.date): the check's, else the capture day. */
	date: string;
	urls: { display: string; thumbnail: string };
	/** The display copy's pixel size: fluid colour is measured on it, and the island draws it. */
	display: { width: number; height: number };
	check: { id: string; checkedOn: string; status: CheckState; examinerId: string; examinerName: string; levelMm: number | null } | null;
	/** The photo's current mark layer; version 0 and an empty layer when nothing was drawn. */
	layer: { layer: MarkLayer; version: number };
}

export interface ComparisonSources {
	specimen: { id: string; objectNumber: string; title: string };
	/** Newest first. */
	photos: ComparisonSourcePhoto[];
}

/**
 * GET /api/photos/[id]/fluid-colour answers { colour: FluidColourAnswer }, ready for analysePair's
 * `colour`; `measuredIn` says where: a fluid mark, or the clear fluid between two level lines. */
export type FluidColourAnswer = (FluidColour & { measuredIn?: string }) | { problem: string };

export interface PersonRef {
	id: string;
	name: string;
}

export interface ComparisonView {
	id: string;
	specimenId: string;
	beforePhotoId: string;
	afterPhotoId: string;
	model: RegistrationModel;
	controlPoints: ControlPair[];
	transform: Matrix3 | null;
	note: string;
	summary: ComparisonSummary;
	version: number;
	createdBy: PersonRef;
	updatedBy: PersonRef;
	createdAt: string;
	updatedAt: string;
}

export interface ComparisonListItem {
	id: string;
	beforePhotoId: string;
	afterPhotoId: string;
	/** The days the two photographs are dated by (ComparisonSourcePhoto.date), YYYY-MM-DD. */
	beforeDate: string;
	afterDate: string;
	model: RegistrationModel;
	counts: Record<ChangeClass, number>;
	createdBy: PersonRef;
	updatedAt: string;
}
