import type { CheckState, Grade, Part, Priority, Reason } from './vocabulary.ts';

/** A condition check as the API shows it. */
export interface CheckView {
	id: string;
	specimen: { id: string; objectNumber: string; title: string; hazards: { flag: string; note: string }[] };
	checkedOn: string;
	examiner: { id: string; name: string };
	reason: Reason;
	state: CheckState;
	parts: Record<Part, { grade: Grade | null; terms: string[]; note: string }>;
	overallGrade: Grade | null;
	overallOverrideReason: string | null;
	priority: Priority | null;
	nextCheckDue: string | null;
	notes: string;
	fluid: {
		readingPercentVol: number | null;
		tempC: number | null;
		glass: 'soda-lime' | 'borosilicate';
		realPercentVol: number | null;
		formaldehyde: 'not-tested' | 'negative' | 'positive';
		pH: number | null;
		levelMm: number | null;
		method: string;
	} | null;
	correctsCheckId: string | null;
	submittedAt: string | null;
	reviewer: { id: string; name: string } | null;
	reviewedAt: string | null;
	reviewComment: string | null;
	version: number;
	updatedAt: string;
}
