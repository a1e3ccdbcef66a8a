import type { MarkLayer } from '../../lib/marks/schema.ts';
import type { ComparisonSummary } from '../../lib/compare/analysis.ts';
import type { ControlPair, RegistrationModel } from '../../lib/compare/schema.ts';
import type { Matrix3 } from '../../lib/compare/registration.ts';

/** What the compare workspace reads from the API (GET /api/specimens/:id/comparison-sources and the comparisons). */
export interface SourcePhoto {
	id: string;
	width: number;
	height: number;
	view: string;
	stage: string;
	capturedAt: string | null;
	urls: { display: string; thumbnail: string };
	display: { width: number; height: number };
	check: { id: string; checkedOn: string; status: string; examinerId: string; examinerName: string; levelMm: number | null } | null;
	layer: { layer: MarkLayer; version: number };
}

export interface Sources {
	specimen: { id: string; objectNumber: string; title: string };
	photos: SourcePhoto[];
}

export interface SavedComparison {
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
	createdBy: { id: string; name: string };
	updatedBy?: { id: string; name: string } | null;
	createdAt: string;
	updatedAt: string;
}

/** The date a photo stands for: its check's, else the day it was taken. */
export const dateOf = (p: SourcePhoto): string => p.check?.checkedOn ?? p.capturedAt?.slice(0, 10) ?? '';

export const photoLabel = (p: SourcePhoto): string => `${dateOf(p) || 'undated'} · ${p.view} · ${p.stage}${p.check ? ` · check ${p.check.status}` : ''}`;
