import type { CureStatus } from './cure.ts';
import type { SuggestedHazard } from './hazards.ts';
import type { Risk, Step } from './schema.ts';
import type { RiskState, TreatmentState } from './vocabulary.ts';

/** A condition check as a treatment links it. */
export interface CheckRef {
	id: string;
	checkedOn: string;
	reason: string;
	state: string;
	overallGrade: string | null;
}

export type StepView = Omit<Step, 'materials'> & {
	materials: (Step['materials'][number] & { cureHours: number | null; fluid: (NonNullable<Step['materials'][number]['fluid']> & { realPercentVol: number | null }) | null })[];
};

export interface Person {
	id: string;
	name: string;
}

/** A treatment as the API shows it, with what the server derives from it now. */
export interface TreatmentView {
	id: string;
	specimen: { id: string; objectNumber: string; title: string; preservativeKind: string; sealType: string; hazards: { flag: string; note: string }[] };
	title: string;
	purpose: string;
	state: TreatmentState;
	beforeCheck: CheckRef | null;
	afterCheck: CheckRef | null;
	steps: StepView[];
	risk: Risk;
	riskState: RiskState;
	riskSubmittedAt: string | null;
	riskReviewer: Person | null;
	riskReviewedAt: string | null;
	riskReviewComment: string | null;
	/** Hazards the record suggests now (they change as the record and the plan change). */
	suggested: SuggestedHazard[];
	/** What stops the assessment going for sign-off; empty when ready. */
	riskProblems: string[];
	/** What stops the treatment being completed; empty when ready. */
	completionProblems: string[];
	cure: CureStatus;
	author: Person;
	/** Active conservators, for "who did this step". */
	people: Person[];
	completedAt: string | null;
	version: number;
	createdAt: string;
	updatedAt: string;
}

/** A line of a list (the specimen's treatments, the review queue). */
export interface TreatmentSummary {
	id: string;
	specimen: { id: string; objectNumber: string; title: string };
	title: string;
	state: TreatmentState;
	riskState: RiskState;
	riskSubmittedAt: string | null;
	author: Person;
	hazards: number;
	/** The worst residual band among the assessed hazards. */
	worstResidual: string | null;
	updatedAt: string;
}

/** A material on the organisation's list. */
export interface MaterialView {
	id: string;
	kind: 'sealant' | 'thread' | 'fluid' | 'other';
	name: string;
	cureHours: number | null;
	note: string;
	active: boolean;
}
