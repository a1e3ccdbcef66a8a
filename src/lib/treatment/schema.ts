import { z } from 'zod';
import { PRESERVATIVE_KINDS } from '../specimen/vocabulary.ts';
import { CONTROLS } from './controls.ts';
import { HAZARD_KINDS } from './hazards.ts';
import type { Level } from './risk.ts';
import { MATERIAL_KINDS, STEP_KINDS, STEP_STATUSES } from './vocabulary.ts';

/**
 * A treatment as the form and the API exchange it: the plan (its steps, each with its record and
 * materials) and the risk assessment. Derived values (real strength of a fluid, a sealant's cure
 * period, the times a step started and finished when not given) are filled in by the server.
 */
export const LIMITS = { steps: 40, materialsPerStep: 12, hazards: 20, text: 4000, title: 200 } as const;

const text = (max: number = LIMITS.text) => z.string().trim().max(max).default('');
const when = z.iso.datetime({ offset: true, message: 'A time must be an ISO 8601 date-time.' }).nullable().default(null);
const id = z.string().regex(/^[A-Za-z0-9_-]{1,40}$/, 'An id is 1–40 letters, digits, _ or -.');

export const FluidUseSchema = z
	.object({
		batch: text(100),
		preservativeKind: z.enum(PRESERVATIVE_KINDS).default('ethanol'),
		/** The strength the batch was made to (e.g. with the fluid tools' dilution), % vol. */
		statedPercentVol: z.number().min(0).max(100).nullable().default(null),
		/** An alcohol-meter reading of the batch and its temperature, corrected to 20 °C by the server. */
		readingPercentVol: z.number().nullable().default(null),
		tempC: z.number().nullable().default(null),
		glass: z.enum(['soda-lime', 'borosilicate']).default('soda-lime'),
	})
	.strict();

export const MaterialUseSchema = z
	.object({
		kind: z.enum(MATERIAL_KINDS),
		/** A material from the organisation's list (sealants need one for their cure period). */
		materialId: z.uuid().nullable().default(null),
		name: text(200),
		amount: text(100),
		/** When a sealant went on: its cure timer starts here. */
		appliedAt: when,
		fluid: FluidUseSchema.nullable().default(null),
	})
	.strict();
export type MaterialUseInput = z.input<typeof MaterialUseSchema>;

export const StepSchema = z
	.object({
		id,
		kind: z.enum(STEP_KINDS),
		title: z.string().trim().min(1, 'Give the step a name.').max(LIMITS.title),
		status: z.enum(STEP_STATUSES).default('planned'),
		doneBy: z.uuid().nullable().default(null),
		startedAt: when,
		finishedAt: when,
		minutes: z.number().int('Time spent is whole minutes.').min(0).max(100_000).nullable().default(null),
		notes: text(),
		materials: z.array(MaterialUseSchema).max(LIMITS.materialsPerStep).default([]),
	})
	.strict();
export type StepInput = z.input<typeof StepSchema>;

const level = (axis: string) =>
	z
		.number()
		.int(`${axis} is a whole number from 1 to 5.`)
		.min(1, `${axis} is a whole number from 1 to 5.`)
		.max(5, `${axis} is a whole number from 1 to 5.`)
		.transform((v) => v as Level);
const RatingSchema = z.object({ likelihood: level('Likelihood'), severity: level('Severity') }).strict();

export const HazardEntrySchema = z
	.object({
		id,
		kind: z.enum(HAZARD_KINDS),
		/** What, here: the quantity, the fluid, the seal, the task. */
		description: text(),
		inherent: RatingSchema,
		controls: z.array(z.enum(CONTROLS)).max(CONTROLS.length).default([]),
		otherControls: text(),
		residual: RatingSchema,
	})
	.strict();

export const DismissalSchema = z.object({ kind: z.enum(HAZARD_KINDS), reason: z.string().trim().min(5, 'Say why this hazard does not apply (at least 5 characters).').max(1000) }).strict();

export const RiskSchema = z
	.object({
		hazards: z.array(HazardEntrySchema).max(LIMITS.hazards).default([]),
		dismissed: z.array(DismissalSchema).max(HAZARD_KINDS.length).default([]),
		notes: text(),
	})
	.strict();

export const TreatmentBodySchema = z
	.object({
		title: z.string().trim().min(1, 'Give the treatment a title.').max(LIMITS.title),
		purpose: text(),
		beforeCheckId: z.uuid().nullable().default(null),
		afterCheckId: z.uuid().nullable().default(null),
		steps: z.array(StepSchema).min(1, 'A plan has at least one step.').max(LIMITS.steps),
		risk: RiskSchema,
	})
	.strict()
	.superRefine((t, ctx) => {
		const seen = new Set<string>();
		t.steps.forEach((s, i) => {
			if (seen.has(s.id)) ctx.addIssue({ code: 'custom', path: ['steps', i, 'id'], message: 'Two steps have the same id.' });
			seen.add(s.id);
		});
		const hz = new Set<string>();
		t.risk.hazards.forEach((h, i) => {
			if (hz.has(h.id)) ctx.addIssue({ code: 'custom', path: ['risk', 'hazards', i, 'id'], message: 'Two hazards have the same id.' });
			hz.add(h.id);
		});
	});
export type TreatmentBody = z.output<typeof TreatmentBodySchema>;
export type TreatmentBodyInput = z.input<typeof TreatmentBodySchema>;
export type Step = TreatmentBody['steps'][number];
export type MaterialUse = Step['materials'][number];
export type HazardEntry = TreatmentBody['risk']['hazards'][number];
export type Risk = TreatmentBody['risk'];

export const OpenTreatmentSchema = z
	.object({
		title: z.string().trim().min(1, 'Give the treatment a title.').max(LIMITS.title),
		purpose: text(),
		beforeCheckId: z.uuid().nullable().default(null),
	})
	.strict();

export const SaveTreatmentSchema = z.object({ version: z.number().int().min(0), treatment: TreatmentBodySchema }).strict();

export const RiskReviewSchema = z
	.object({ decision: z.enum(['sign-off', 'return']), comment: z.string().trim().max(5000).default('') })
	.strict()
	.refine((r) => r.decision === 'sign-off' || r.comment.length >= 5, { message: 'Say what needs changing when you return a risk assessment.', path: ['comment'] });

export const VersionOnlySchema = z.object({ version: z.number().int().min(0) }).strict();
