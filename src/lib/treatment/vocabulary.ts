/**
 * The words of a treatment (TRADE.md, "Treatment (re-jarring / remounting) in outline"): the steps
 * of the starting plan, in the trade's order but with Meniscus's own names, the life of a step and
 * of a treatment, and the kinds of material a step records.
 */
export const STEP_KINDS = [
	'photograph-before',
	'identify-fluid',
	'open-seal',
	'drain-fluid',
	'lift-specimen',
	'clean-rim',
	'remount',
	'refill',
	'seal',
	'cure',
	'finish-seal',
	'photograph-after',
	'record',
	'custom',
] as const;
export type StepKind = (typeof STEP_KINDS)[number];

export interface StepKindInfo {
	title: string;
	hint: string;
	/**
	 * Work on the open jar or its contents: such a step may not be started before a reviewer has
	 * signed off the risk assessment. Photographing the closed jar is not.
	 */
	work: boolean;
	/** Handling that moves the jar or stresses its seal: warned about while a sealant cures. */
	disturbs: boolean;
	/** The step puts sealant on: it starts a cure timer for the sealant it records. */
	appliesSealant: boolean;
}

export const STEP_KIND_INFO: Record<StepKind, StepKindInfo> = {
	'photograph-before': { title: 'Photograph before work', hint: 'Same views, scale and grey card as the condition check.', work: false, disturbs: false, appliesSealant: false },
	'identify-fluid': { title: 'Identify and test the fluid', hint: 'Density or meter reading, formaldehyde strip; never sniff an unknown fluid.', work: true, disturbs: true, appliesSealant: false },
	'open-seal': { title: 'Open the seal', hint: 'Shave silicone with a blade; soften pitch or wax with gentle heat.', work: true, disturbs: true, appliesSealant: false },
	'drain-fluid': { title: 'Drain and keep the fluid', hint: 'Into a labelled, closed container; note the volume.', work: true, disturbs: true, appliesSealant: false },
	'lift-specimen': { title: 'Lift out and hold the specimen', hint: 'In the same or a similar fluid; step gradually between different fluids.', work: true, disturbs: true, appliesSealant: false },
	'clean-rim': { title: 'Clean rim and lid', hint: 'Remove all old sealant and grease; surfaces must end totally dry.', work: true, disturbs: true, appliesSealant: false },
	remount: { title: 'Re-suspend on new threads', hint: 'Position the specimen in the empty jar.', work: true, disturbs: true, appliesSealant: false },
	refill: { title: 'Refill, leaving an airspace', hint: 'Record the fluid batch and its strength.', work: true, disturbs: true, appliesSealant: false },
	seal: { title: 'Seal on dry surfaces', hint: 'Record the sealant and when it went on: the cure timer starts then.', work: true, disturbs: true, appliesSealant: true },
	cure: { title: 'Leave the sealant to cure', hint: 'Do not move the jar or top it up until the cure period has passed.', work: true, disturbs: false, appliesSealant: false },
	'finish-seal': { title: 'Finish the seal', hint: 'Trim, second bead or outer tape once the first bead has cured.', work: true, disturbs: true, appliesSealant: true },
	'photograph-after': { title: 'Photograph after work', hint: 'The same camera, lighting and viewpoint as before.', work: false, disturbs: true, appliesSealant: false },
	record: { title: 'Record methods and materials', hint: 'What was done, with what, and why.', work: false, disturbs: false, appliesSealant: false },
	custom: { title: 'Other step', hint: '', work: true, disturbs: true, appliesSealant: false },
};

/** The starting plan: every kind but `custom`, in the outline's order. */
export const TEMPLATE_STEPS: readonly Exclude<StepKind, 'custom'>[] = STEP_KINDS.filter((k): k is Exclude<StepKind, 'custom'> => k !== 'custom');

export const STEP_STATUSES = ['planned', 'started', 'done', 'skipped'] as const;
export type StepStatus = (typeof STEP_STATUSES)[number];

export const STEP_STATUS_LABELS: Record<StepStatus, string> = { planned: 'Planned', started: 'Started', done: 'Done', skipped: 'Not needed' };

/** A treatment is planned, under way once a step has started, and completed or abandoned. */
export const TREATMENT_STATES = ['planning', 'in-progress', 'completed', 'abandoned'] as const;
export type TreatmentState = (typeof TREATMENT_STATES)[number];

export const TREATMENT_STATE_LABELS: Record<TreatmentState, string> = { planning: 'Planning', 'in-progress': 'Under way', completed: 'Completed', abandoned: 'Abandoned' };

/** The risk assessment's own review: written, waiting, signed off, or returned with comments. */
export const RISK_STATES = ['draft', 'in-review', 'signed-off', 'returned'] as const;
export type RiskState = (typeof RISK_STATES)[number];

export const RISK_STATE_LABELS: Record<RiskState, string> = { draft: 'Being written', 'in-review': 'Waiting for sign-off', 'signed-off': 'Signed off', returned: 'Returned with comments' };

export const MATERIAL_KINDS = ['sealant', 'thread', 'fluid', 'other'] as const;
export type MaterialKind = (typeof MATERIAL_KINDS)[number];

export const MATERIAL_KIND_LABELS: Record<MaterialKind, string> = { sealant: 'Sealant', thread: 'Thread', fluid: 'Fluid', other: 'Other material' };
