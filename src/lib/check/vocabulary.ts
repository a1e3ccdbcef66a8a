/**
 * The words of a condition check (TRADE.md, "When and what people check"): the parts examined, the
 * four-step grade scale, the reasons for a check, and the starting vocabulary of damage terms per
 * part, which an administrator can extend.
 */
export const PARTS = ['container', 'lid', 'seal', 'fluid', 'specimen', 'mount', 'label'] as const;
export type Part = (typeof PARTS)[number];

/** Good / Fair / Poor / Unacceptable, the common four-step scale of fluid-collection surveys [S4][S49]. */
export const GRADES = ['good', 'fair', 'poor', 'unacceptable'] as const;
export type Grade = (typeof GRADES)[number];

export const REASONS = ['routine-survey', 'before-treatment', 'after-treatment', 'loan-out', 'loan-return', 'incident'] as const;
export type Reason = (typeof REASONS)[number];

/** Treatment priority, most pressing first; stated in the UI as Meniscus's own four steps. */
export const PRIORITIES = ['urgent', 'high', 'routine', 'none'] as const;
export type Priority = (typeof PRIORITIES)[number];

export const CHECK_STATES = ['draft', 'in-review', 'returned', 'approved'] as const;
export type CheckState = (typeof CHECK_STATES)[number];

export const CHECK_LABELS = {
	part: { container: 'Container', lid: 'Lid / closure', seal: 'Seal / gasket', fluid: 'Fluid', specimen: 'Specimen', mount: 'Mount', label: 'Label' },
	grade: { good: 'Good', fair: 'Fair', poor: 'Poor', unacceptable: 'Unacceptable' },
	gradeMeaning: {
		good: 'Sound; no work needed.',
		fair: 'Minor, mainly aesthetic damage; no immediate action.',
		poor: 'Unstable or large losses; not fit for display or loan; action desirable.',
		unacceptable: 'Severely weakened, actively deteriorating or endangering other objects.',
	},
	reason: {
		'routine-survey': 'Routine survey',
		'before-treatment': 'Before treatment',
		'after-treatment': 'After treatment',
		'loan-out': 'Loan out',
		'loan-return': 'Loan return',
		incident: 'Incident',
	},
	priority: { urgent: 'Urgent', high: 'High', routine: 'Routine', none: 'None' },
	state: { draft: 'Draft', 'in-review': 'In review', returned: 'Returned', approved: 'Approved' },
} as const;

/** The damage terms Meniscus starts with, by part (TRADE.md, with its sources). */
export const DEFAULT_TERMS: Record<Part, readonly string[]> = {
	container: ['cracked', 'chipped', 'weeping glass', 'crizzling', 'efflorescence', 'acrylic crazed', 'acrylic scratched'],
	lid: ['cracked', 'embrittled', 'corroded', 'seized', 'loose', 'missing'],
	seal: ['cracked', 'dried', 'perished', 'failed', 'leaking'],
	fluid: ['low level / evaporation', 'discoloured', 'cloudy', 'precipitate', 'sediment'],
	specimen: ['desiccation', 'tissue loss', 'fading / bleaching', 'shrinkage', 'swelling', 'distortion', 'mould', 'exposed above the fluid', 'detached from mount'],
	mount: ['snapped thread', 'slack thread', 'fallen from position'],
	label: ['faded', 'detached', 'torn', 'illegible'],
};
