import { bandOf, bandRank, score } from './risk.ts';
import { HAZARD_LABELS, type HazardKind } from './hazards.ts';
import { STEP_KIND_INFO, type RiskState, type StepKind, type StepStatus, type TreatmentState } from './vocabulary.ts';

/**
 * Who may do what to a treatment, and when (DESIGN.md roles). Conservators plan, assess and
 * record; a reviewer other than the treatment's author signs off or returns its risk assessment.
 * Work steps cannot be started until the risk assessment is signed off; changing the assessed
 * hazards after sign-off voids the sign-off. A completed or abandoned treatment never changes.
 * The server enforces these rules for every request; the UI only hides what they refuse.
 */
export type TreatmentAction = 'edit' | 'submit-risk' | 'sign-off' | 'return-risk' | 'complete' | 'abandon';

export interface TreatmentFacts {
	state: TreatmentState;
	riskState: RiskState;
	authorId: string;
}

export interface Actor {
	id: string;
	role: 'conservator' | 'reviewer' | 'curator' | 'admin';
}

export type Verdict = { ok: true } | { ok: false; reason: string };

const no = (reason: string): Verdict => ({ ok: false, reason });

export function decideTreatment(t: TreatmentFacts, action: TreatmentAction, actor: Actor): Verdict {
	const closed = t.state === 'completed' || t.state === 'abandoned';
	switch (action) {
		case 'edit':
		case 'submit-risk':
		case 'complete':
		case 'abandon':
			if (actor.role !== 'conservator') return no('Only conservators plan, assess and record treatments.');
			if (closed) return no(`This treatment is ${t.state}; it cannot be changed.`);
			if (action === 'submit-risk') {
				if (t.riskState === 'in-review') return no('The risk assessment is already waiting for sign-off.');
				if (t.riskState === 'signed-off') return no('The risk assessment is already signed off.');
			}
			return { ok: true };
		case 'sign-off':
		case 'return-risk':
			if (actor.role !== 'reviewer') return no('Only reviewers sign off or return risk assessments.');
			if (actor.id === t.authorId) return no('Nobody may sign off their own risk assessment.');
			if (closed) return no(`This treatment is ${t.state}.`);
			if (t.riskState !== 'in-review') return no('Only a risk assessment waiting for sign-off can be signed off or returned.');
			return { ok: true };
		default:
			return no('Unknown action.');
	}
}

export interface StepFacts {
	id: string;
	kind: StepKind;
	title: string;
	status: StepStatus;
}

/**
 * The gate on work steps: a step of a kind that works on the open jar may leave `planned` (be
 * started or marked done) only while the risk assessment is signed off. Steps already started
 * under a sign-off may still be finished if a later change voids it.
 */
export function stepGateProblems(before: readonly StepFacts[], after: readonly StepFacts[], riskState: RiskState): string[] {
	if (riskState === 'signed-off') return [];
	const was = new Map(before.map((s) => [s.id, s.status]));
	const problems: string[] = [];
	for (const s of after) {
		const from = was.get(s.id) ?? 'planned';
		const leaves = from === 'planned' || from === 'skipped';
		if (STEP_KIND_INFO[s.kind].work && leaves && (s.status === 'started' || s.status === 'done')) {
			problems.push(`“${s.title}” cannot be started before a reviewer has signed off the risk assessment.`);
		}
	}
	return problems;
}

export interface AssessedHazard {
	kind: HazardKind;
	inherent: { likelihood: 1 | 2 | 3 | 4 | 5; severity: 1 | 2 | 3 | 4 | 5 };
	residual: { likelihood: 1 | 2 | 3 | 4 | 5; severity: 1 | 2 | 3 | 4 | 5 };
	controls: readonly string[];
	otherControls: string;
}

/**
 * What stops an assessment going for sign-off (and being signed off): a suggested hazard neither
 * assessed nor dismissed, an assessed hazard without a control, a residual rating worse than the
 * rating before controls, or a residual rating in the very-high band. Empty when ready.
 */
export function riskProblems(risk: { hazards: readonly AssessedHazard[]; dismissed: readonly { kind: HazardKind }[] }, suggested: readonly HazardKind[]): string[] {
	const problems: string[] = [];
	if (risk.hazards.length === 0) problems.push('Assess at least one hazard.');
	const covered = new Set<HazardKind>([...risk.hazards.map((h) => h.kind), ...risk.dismissed.map((d) => d.kind)]);
	for (const k of suggested) if (!covered.has(k)) problems.push(`The record suggests a hazard not yet assessed or dismissed: ${HAZARD_LABELS[k]}.`);
	risk.hazards.forEach((h, i) => {
		const n = `Hazard ${i + 1} (${HAZARD_LABELS[h.kind]})`;
		if (h.controls.length === 0 && h.otherControls.trim() === '') problems.push(`${n}: choose at least one control.`);
		if (score(h.residual) > score(h.inherent)) problems.push(`${n}: the residual rating is worse than the rating before controls.`);
		if (bandRank(bandOf(h.residual)) === bandRank('very-high')) problems.push(`${n}: the residual risk is very high; change the plan or the controls before the work goes ahead.`);
	});
	return problems;
}

/** What stops a treatment being completed: steps still to do, or no after-treatment check linked. */
export function completionProblems(t: { steps: readonly StepFacts[]; afterCheckId: string | null }): string[] {
	const problems: string[] = [];
	const open = t.steps.filter((s) => s.status === 'planned' || s.status === 'started');
	if (open.length > 0) problems.push(`Finish or mark as not needed: ${open.map((s) => `“${s.title}”`).join(', ')}.`);
	if (!t.afterCheckId) problems.push('Link the after-treatment condition check.');
	return problems;
}

/**
 * Whether an edit changes what a reviewer signed off: the hazards, their ratings and controls,
 * the dismissals and the notes. Compared as canonical JSON, so reordering keys changes nothing.
 */
export function assessmentChanged(before: unknown, after: unknown): boolean {
	return canonical(before) !== canonical(after);
}

function canonical(v: unknown): string {
	if (Array.isArray(v)) return `[${v.map(canonical).join(',')}]`;
	if (v && typeof v === 'object') {
		return `{${Object.keys(v)
			.sort()
			.map((k) => `${JSON.stringify(k)}:${canonical((v as Record<string, unknown>)[k])}`)
			.join(',')}}`;
	}
	return JSON.stringify(v) ?? 'null';
}
