import type { Transaction } from 'sequelize';
import { db } from '../db.ts';
import { ConditionCheck, Specimen, Treatment } from '../models/index.ts';
import { audit } from '../audit.ts';
import { mailRiskReviewed, mailRiskSubmitted } from '../mail/riskMail.ts';
import { deriveSteps } from './derive.ts';
import { TreatmentError } from './errors.ts';
import { include, treatmentSummary, treatmentView, type Loaded } from './presenter.ts';
import { templatePlan, shortId } from '../../treatment/plan.ts';
import { assessmentChanged, completionProblems, decideTreatment, stepGateProblems, type Actor, type TreatmentAction } from '../../treatment/workflow.ts';
import type { TreatmentBody } from '../../treatment/schema.ts';
import type { TreatmentSummary, TreatmentView } from '../../treatment/view.ts';

/**
 * Treatments: opening one on a specimen with the starting plan, saving the plan and the risk
 * assessment (naming the version the edit started from), asking for sign-off, the reviewer's
 * sign-off or return, completing and abandoning. Every rule is decided by src/lib/treatment/
 * workflow.ts and written with its audit event (and its mail) in one transaction.
 */
export interface TreatmentActor extends Actor {
	clientAddress: string | null;
}

async function loaded(id: string, transaction?: Transaction): Promise<Loaded | null> {
	return (await Treatment.findByPk(id, { include, transaction })) as Loaded | null;
}

async function view(id: string, transaction?: Transaction): Promise<TreatmentView> {
	return treatmentView((await loaded(id, transaction))!, new Date(), transaction);
}

async function lock(id: string, transaction: Transaction): Promise<Treatment> {
	const t = await Treatment.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
	if (!t) throw new TreatmentError(404, 'No such treatment.');
	return t;
}

function allow(t: Treatment, action: TreatmentAction, actor: Actor) {
	const v = decideTreatment({ state: t.state, riskState: t.riskState, authorId: t.createdBy }, action, actor);
	if (!v.ok) throw new TreatmentError(403, v.reason);
}

async function stale(t: Treatment, version: number, transaction: Transaction, message: string) {
	if (t.version !== version) throw new TreatmentError(409, message, await view(t.id, transaction));
}

/** A linked check must be a check of the same specimen. */
async function checkOf(specimenId: string, checkId: string | null, which: string, transaction: Transaction): Promise<void> {
	if (!checkId) return;
	const c = await ConditionCheck.findByPk(checkId, { transaction, attributes: ['id', 'specimenId'] });
	if (!c || c.specimenId !== specimenId) throw new TreatmentError(400, `The ${which} check must be a condition check of this specimen.`);
}

export async function getTreatment(id: string): Promise<TreatmentView | null> {
	const t = await loaded(id);
	return t ? treatmentView(t) : null;
}

export async function treatmentsOfSpecimen(specimenId: string): Promise<TreatmentSummary[]> {
	const rows = (await Treatment.findAll({ where: { specimenId }, include, order: [['createdAt', 'DESC']] })) as Loaded[];
	return rows.map(treatmentSummary);
}

/** Risk assessments waiting for sign-off (oldest first), or one conservator's open treatments. */
export async function treatmentList(which: 'queue' | 'mine', actor: Actor): Promise<TreatmentSummary[]> {
	const where = which === 'queue' ? { riskState: 'in-review' } : { createdBy: actor.id, state: ['planning', 'in-progress'] };
	const order: [string, string][] = which === 'queue' ? [['riskSubmittedAt', 'ASC']] : [['updatedAt', 'DESC']];
	const rows = (await Treatment.findAll({ where, include, order, limit: 200 })) as Loaded[];
	return rows.map(treatmentSummary);
}

export async function openTreatment(actor: TreatmentActor, specimenId: string, body: { title: string; purpose: string; beforeCheckId: string | null }): Promise<TreatmentView> {
	if (actor.role !== 'conservator') throw new TreatmentError(403, 'Only conservators plan treatments.');
	return db().transaction(async (transaction) => {
		const s = await Specimen.findByPk(specimenId, { transaction });
		if (!s) throw new TreatmentError(404, 'No such specimen.');
		await checkOf(specimenId, body.beforeCheckId, 'before-treatment', transaction);
		const t = await Treatment.create(
			{
				specimenId,
				title: body.title,
				purpose: body.purpose,
				beforeCheckId: body.beforeCheckId,
				afterCheckId: null,
				steps: templatePlan(s.sealType, () => shortId()),
				risk: { hazards: [], dismissed: [], notes: '' },
				riskSubmittedAt: null,
				riskReviewerId: null,
				riskReviewedAt: null,
				riskReviewComment: null,
				completedAt: null,
				createdBy: actor.id,
				updatedBy: actor.id,
			},
			{ transaction },
		);
		await audit({ action: 'treatment.open', entityType: 'treatment', entityId: t.id, actorId: actor.id, after: { specimenId, title: body.title, beforeCheckId: body.beforeCheckId }, clientAddress: actor.clientAddress }, transaction);
		return view(t.id, transaction);
	});
}

export async function saveTreatment(actor: TreatmentActor, id: string, version: number, body: TreatmentBody, now = new Date()): Promise<TreatmentView> {
	return db().transaction(async (transaction) => {
		const t = await lock(id, transaction);
		allow(t, 'edit', actor);
		await stale(t, version, transaction, 'Someone saved this treatment while you were editing it. Your entries are kept; compare and save again.');
		await checkOf(t.specimenId, body.beforeCheckId, 'before-treatment', transaction);
		await checkOf(t.specimenId, body.afterCheckId, 'after-treatment', transaction);
		const riskChanged = assessmentChanged(t.risk, body.risk);
		if (riskChanged && t.riskState === 'in-review') throw new TreatmentError(403, 'The risk assessment is waiting for sign-off and cannot be changed now; the reviewer can return it to you.');
		// Changing what was signed off voids the sign-off: the changed assessment needs its own.
		const riskState = riskChanged && t.riskState === 'signed-off' ? 'draft' : t.riskState;
		const gate = stepGateProblems(t.steps, body.steps, riskState);
		if (gate.length > 0) throw new TreatmentError(403, gate[0]!, undefined, gate);
		const steps = await deriveSteps(t.steps, body.steps, actor.id, now, transaction);
		const begun = steps.some((s) => s.status === 'started' || s.status === 'done');
		const before = { state: t.state, riskState: t.riskState };
		t.set({
			title: body.title,
			purpose: body.purpose,
			beforeCheckId: body.beforeCheckId,
			afterCheckId: body.afterCheckId,
			steps,
			risk: structuredClone(body.risk),
			riskState,
			...(riskState !== t.riskState ? { riskReviewerId: null, riskReviewedAt: null, riskSubmittedAt: null } : {}),
			state: begun ? 'in-progress' : t.state === 'in-progress' ? 'in-progress' : 'planning',
			updatedBy: actor.id,
		});
		// JSONB replaced as a whole (never changed in place, Sequelize #13006), so it is always saved.
		t.changed('steps', true);
		t.changed('risk', true);
		await t.save({ transaction });
		await audit({ action: 'treatment.save', entityType: 'treatment', entityId: id, actorId: actor.id, before, after: { state: t.state, riskState, steps: steps.map((s) => ({ id: s.id, status: s.status })) }, clientAddress: actor.clientAddress }, transaction);
		if (riskState !== before.riskState) await audit({ action: 'treatment.risk-voided', entityType: 'treatment', entityId: id, actorId: actor.id, before: { riskState: before.riskState }, after: { riskState }, clientAddress: actor.clientAddress }, transaction);
		return view(id, transaction);
	});
}

export async function submitRisk(actor: TreatmentActor, id: string, version: number): Promise<TreatmentView> {
	return db().transaction(async (transaction) => {
		const t = await lock(id, transaction);
		allow(t, 'submit-risk', actor);
		await stale(t, version, transaction, 'This treatment changed since you opened it; reload it before asking for sign-off.');
		const problems = (await view(id, transaction)).riskProblems;
		if (problems.length > 0) throw new TreatmentError(400, `The risk assessment is not ready for sign-off: ${problems[0]}`, undefined, problems);
		const before = t.riskState;
		t.set({ riskState: 'in-review', riskSubmittedAt: new Date(), riskReviewerId: null, riskReviewedAt: null, riskReviewComment: null, updatedBy: actor.id });
		await t.save({ transaction });
		await audit({ action: 'treatment.risk-submit', entityType: 'treatment', entityId: id, actorId: actor.id, before: { riskState: before }, after: { riskState: 'in-review' }, clientAddress: actor.clientAddress }, transaction);
		await mailRiskSubmitted(t, transaction);
		return view(id, transaction);
	});
}

export async function reviewRisk(actor: TreatmentActor, id: string, decision: 'sign-off' | 'return', comment: string): Promise<TreatmentView> {
	return db().transaction(async (transaction) => {
		const t = await lock(id, transaction);
		allow(t, decision === 'sign-off' ? 'sign-off' : 'return-risk', actor);
		if (decision === 'sign-off') {
			const problems = (await view(id, transaction)).riskProblems;
			if (problems.length > 0) throw new TreatmentError(400, `This assessment cannot be signed off: ${problems[0]}`, undefined, problems);
		}
		const next = decision === 'sign-off' ? 'signed-off' : 'returned';
		t.set({ riskState: next, riskReviewerId: actor.id, riskReviewedAt: new Date(), riskReviewComment: comment || null });
		await t.save({ transaction });
		await audit({ action: `treatment.risk-${decision}`, entityType: 'treatment', entityId: id, actorId: actor.id, before: { riskState: 'in-review' }, after: { riskState: next, comment }, clientAddress: actor.clientAddress }, transaction);
		await mailRiskReviewed(t, decision, transaction);
		return view(id, transaction);
	});
}

export async function closeTreatment(actor: TreatmentActor, id: string, version: number, how: 'complete' | 'abandon', reason = ''): Promise<TreatmentView> {
	return db().transaction(async (transaction) => {
		const t = await lock(id, transaction);
		allow(t, how, actor);
		await stale(t, version, transaction, 'This treatment changed since you opened it; reload it first.');
		if (how === 'complete') {
			const problems = completionProblems({ steps: t.steps, afterCheckId: t.afterCheckId });
			if (problems.length > 0) throw new TreatmentError(400, `The treatment cannot be completed yet: ${problems[0]}`, undefined, problems);
		} else if (reason.length < 5) throw new TreatmentError(400, 'Say why the treatment is abandoned (at least 5 characters).');
		const next = how === 'complete' ? 'completed' : 'abandoned';
		const before = t.state;
		t.set({ state: next, completedAt: new Date(), updatedBy: actor.id, ...(how === 'abandon' ? { purpose: `${t.purpose}${t.purpose ? '\n\n' : ''}Abandoned: ${reason}` } : {}) });
		await t.save({ transaction });
		await audit({ action: `treatment.${how}`, entityType: 'treatment', entityId: id, actorId: actor.id, before: { state: before }, after: { state: next, reason: reason || undefined }, clientAddress: actor.clientAddress }, transaction);
		return view(id, transaction);
	});
}
