import { ConditionCheck, Specimen, Treatment, User } from '../models/index.ts';
import { suggestHazards } from '../../treatment/hazards.ts';
import { cureStatus } from '../../treatment/cure.ts';
import { completionProblems, riskProblems } from '../../treatment/workflow.ts';
import { worstBand } from '../../treatment/risk.ts';
import type { CheckRef, TreatmentSummary, TreatmentView } from '../../treatment/view.ts';
import type { Transaction } from 'sequelize';

/** Treatments as the API shows them: the stored record plus what is derived from it now. */
export const include = [
	{ model: Specimen, as: 'specimen' },
	{ model: User, as: 'author', attributes: ['id', 'name'] },
	{ model: User, as: 'riskReviewer', attributes: ['id', 'name'] },
	{ model: ConditionCheck, as: 'beforeCheck' },
	{ model: ConditionCheck, as: 'afterCheck' },
];

type Loaded = Treatment & { specimen: Specimen; author: User; riskReviewer: User | null; beforeCheck: ConditionCheck | null; afterCheck: ConditionCheck | null };

export const checkRef = (c: ConditionCheck | null): CheckRef | null =>
	c ? { id: c.id, checkedOn: c.checkedOn, reason: c.reason, state: c.state, overallGrade: c.overallGrade } : null;

const iso = (d: Date | null) => (d ? d.toISOString() : null);

/** The latest fluid reading of the specimen's checks, for the hazard suggestions. */
async function latestFluid(specimenId: string, transaction?: Transaction) {
	const c = await ConditionCheck.findOne({ where: { specimenId }, order: [['checkedOn', 'DESC'], ['createdAt', 'DESC']], attributes: ['fluid'], transaction });
	const f = c?.fluid;
	return f ? { realPercentVol: f.realPercentVol, formaldehyde: f.formaldehyde, levelMm: f.levelMm } : null;
}

export async function treatmentView(t: Loaded, now = new Date(), transaction?: Transaction): Promise<TreatmentView> {
	const s = t.specimen;
	const suggested = suggestHazards({
		preservativeKind: s.preservativeKind,
		sealType: s.sealType,
		hazards: s.hazards,
		jar: { shape: s.containerShape, widthMm: s.innerWidthMm, depthMm: s.innerDepthMm, heightMm: s.innerHeightMm },
		latestFluid: await latestFluid(s.id, transaction),
		steps: t.steps.map((x) => x.kind),
	});
	return {
		id: t.id,
		specimen: { id: s.id, objectNumber: s.objectNumber, title: s.title, preservativeKind: s.preservativeKind, sealType: s.sealType, hazards: s.hazards },
		title: t.title,
		purpose: t.purpose,
		state: t.state,
		beforeCheck: checkRef(t.beforeCheck),
		afterCheck: checkRef(t.afterCheck),
		steps: t.steps,
		risk: t.risk,
		riskState: t.riskState,
		riskSubmittedAt: iso(t.riskSubmittedAt),
		riskReviewer: t.riskReviewer ? { id: t.riskReviewer.id, name: t.riskReviewer.name } : null,
		riskReviewedAt: iso(t.riskReviewedAt),
		riskReviewComment: t.riskReviewComment,
		suggested,
		riskProblems: riskProblems(t.risk, suggested.map((h) => h.kind)),
		completionProblems: completionProblems({ steps: t.steps, afterCheckId: t.afterCheckId }),
		cure: cureStatus(t.steps, now),
		author: { id: t.author.id, name: t.author.name },
		people: (await User.findAll({ where: { role: 'conservator', disabled: false }, attributes: ['id', 'name'], order: [['name', 'ASC']], transaction })).map((u) => ({ id: u.id, name: u.name })),
		completedAt: iso(t.completedAt),
		version: t.version,
		createdAt: t.createdAt.toISOString(),
		updatedAt: t.updatedAt.toISOString(),
	};
}

export function treatmentSummary(t: Loaded): TreatmentSummary {
	return {
		id: t.id,
		specimen: { id: t.specimen.id, objectNumber: t.specimen.objectNumber, title: t.specimen.title },
		title: t.title,
		state: t.state,
		riskState: t.riskState,
		riskSubmittedAt: iso(t.riskSubmittedAt),
		author: { id: t.author.id, name: t.author.name },
		hazards: t.risk.hazards.length,
		worstResidual: worstBand(t.risk.hazards.map((h) => h.residual)),
		updatedAt: t.updatedAt.toISOString(),
	};
}

export type { Loaded };
