import { Op, type Transaction } from 'sequelize';
import { db } from '../db.ts';
import { ConditionCheck, Specimen, User } from '../models/index.ts';
import type { PartRecord, StoredFluid } from '../models/ConditionCheck.ts';
import { audit } from '../audit.ts';
import { mailCheckReviewed, mailCheckSubmitted } from '../mail/checkMail.ts';
import { checkView } from './presenter.ts';
import { intervals } from './settings.ts';
import { decideTransition, type Actor, type CheckAction } from '../../check/workflow.ts';
import { nextCheckDue, overallGrade } from '../../check/grading.ts';
import { PARTS, type Part } from '../../check/vocabulary.ts';
import type { CheckBody } from '../../check/schema.ts';
import type { CheckView } from '../../check/view.ts';
import { realStrengthAt20 } from '../../fluid/alcoholometry.ts';

/**
 * Condition checks: opening, editing (drafts and returned checks only, naming the version the edit
 * started from), submitting and reviewing. Every transition is decided by workflow.ts, written with
 * its audit event in one transaction, and an approved check is never changed (the database refuses
 * it too). Approval writes the condition found onto the specimen.
 */
export class CheckError extends Error {
	constructor(
		readonly status: 400 | 403 | 404 | 409,
		message: string,
		readonly current?: CheckView,
	) {
		super(message);
	}
}

export interface CheckActor extends Actor {
	clientAddress: string | null;
}

const include = [
	{ model: Specimen, as: 'specimen' },
	{ model: User, as: 'examiner' },
	{ model: User, as: 'reviewer' },
];

async function load(id: string, transaction?: Transaction, lock = false) {
	const c = await ConditionCheck.findByPk(id, { transaction, ...(lock && transaction ? { lock: transaction.LOCK.UPDATE } : {}) });
	if (!c) throw new CheckError(404, 'No such condition check.');
	return c;
}

async function view(id: string, transaction?: Transaction): Promise<CheckView> {
	return checkView((await ConditionCheck.findByPk(id, { include, transaction }))!);
}

function allow(c: ConditionCheck, action: CheckAction, actor: Actor) {
	const v = decideTransition({ state: c.state, examinerId: c.examinerId }, action, actor);
	if (!v.ok) throw new CheckError(403, v.reason);
	return v.next;
}

const emptyParts = (): Record<Part, PartRecord> => Object.fromEntries(PARTS.map((p) => [p, { grade: null, terms: [], note: '' }])) as unknown as Record<Part, PartRecord>;

export async function getCheck(id: string): Promise<CheckView | null> {
	const c = await ConditionCheck.findByPk(id, { include });
	return c ? checkView(c) : null;
}

export async function checksOfSpecimen(specimenId: string): Promise<CheckView[]> {
	const rows = await ConditionCheck.findAll({ where: { specimenId }, include, order: [['checkedOn', 'DESC'], ['createdAt', 'DESC']] });
	return rows.map(checkView);
}

/** Drafts and returned checks of one examiner, or every check waiting for review (oldest first). */
export async function checkList(view: 'mine' | 'queue', actor: Actor): Promise<CheckView[]> {
	const where = view === 'mine' ? { examinerId: actor.id, state: { [Op.in]: ['draft', 'returned'] } } : { state: 'in-review' };
	const order: [string, string][] = view === 'mine' ? [['updatedAt', 'DESC']] : [['submittedAt', 'ASC']];
	return (await ConditionCheck.findAll({ where, include, order, limit: 200 })).map(checkView);
}

/**
 * For checks in the review queue, the grade the specimen had at its previous approved check, so a
 * reviewer sees at a glance what changed ("fair → poor"). One query for the whole queue.
 */
export async function previousApproved(checks: CheckView[]): Promise<Record<string, { checkedOn: string; overallGrade: string | null }>> {
	if (checks.length === 0) return {};
	const approved = await ConditionCheck.findAll({
		where: { specimenId: { [Op.in]: [...new Set(checks.map((c) => c.specimen.id))] }, state: 'approved' },
		attributes: ['id', 'specimenId', 'checkedOn', 'overallGrade'],
		order: [['checkedOn', 'DESC'], ['reviewedAt', 'DESC']],
	});
	const out: Record<string, { checkedOn: string; overallGrade: string | null }> = {};
	for (const c of checks) {
		const p = approved.find((a) => a.specimenId === c.specimen.id && a.id !== c.id && a.checkedOn <= c.checkedOn);
		if (p) out[c.id] = { checkedOn: p.checkedOn, overallGrade: p.overallGrade };
	}
	return out;
}

/** Opens a draft check on a specimen; `corrects` names an approved check this one corrects. */
export async function openCheck(actor: CheckActor, specimenId: string, corrects?: string): Promise<CheckView> {
	if (actor.role !== 'conservator') throw new CheckError(403, 'Only conservators open condition checks.');
	return db().transaction(async (transaction) => {
		if (!(await Specimen.findByPk(specimenId, { transaction }))) throw new CheckError(404, 'No such specimen.');
		let base: ConditionCheck | null = null;
		if (corrects) {
			base = await ConditionCheck.findByPk(corrects, { transaction });
			if (!base || base.specimenId !== specimenId || base.state !== 'approved') throw new CheckError(400, 'Only an approved check of this specimen can be corrected.');
		}
		const c = await ConditionCheck.create(
			{
				specimenId,
				checkedOn: base?.checkedOn ?? new Date().toISOString().slice(0, 10),
				examinerId: actor.id,
				reason: base?.reason ?? 'routine-survey',
				parts: base ? structuredClone(base.parts) : emptyParts(),
				overallGrade: base?.overallGrade ?? null,
				overallOverrideReason: base?.overallOverrideReason ?? null,
				priority: base?.priority ?? null,
				nextCheckDue: base?.nextCheckDue ?? null,
				notes: base?.notes ?? '',
				fluid: base?.fluid ? structuredClone(base.fluid) : null,
				correctsCheckId: base?.id ?? null,
				submittedAt: null,
				reviewerId: null,
				reviewedAt: null,
				reviewComment: null,
			},
			{ transaction },
		);
		await audit({ action: 'check.open', entityType: 'check', entityId: c.id, actorId: actor.id, after: { specimenId, corrects: base?.id ?? null }, clientAddress: actor.clientAddress }, transaction);
		return view(c.id, transaction);
	});
}

/** The derived values of a check body: overall grade, real strength, next check due. */
async function derive(body: CheckBody) {
	const overall = overallGrade(
		PARTS.map((p) => body.parts[p].grade),
		body.overallOverride ?? undefined,
	);
	if (overall.problem) throw new CheckError(400, overall.problem);
	let fluid: StoredFluid | null = null;
	if (body.fluid) {
		const { readingPercentVol: r, tempC: t } = body.fluid;
		if ((r === null) !== (t === null)) throw new CheckError(400, 'Give both the meter reading and the temperature, or neither.');
		let realPercentVol: number | null = null;
		try {
			realPercentVol = r !== null && t !== null ? realStrengthAt20(r, t, body.fluid.glass) : null;
		} catch (err) {
			if (err instanceof RangeError) throw new CheckError(400, `Fluid reading: ${err.message}`);
			throw err;
		}
		fluid = { ...body.fluid, realPercentVol };
	}
	const due = overall.grade ? nextCheckDue(body.checkedOn, overall.grade, await intervals()) : null;
	return { overall, fluid, due };
}

export async function saveCheck(actor: CheckActor, id: string, version: number, body: CheckBody): Promise<CheckView> {
	const { overall, fluid, due } = await derive(body);
	return db().transaction(async (transaction) => {
		const c = await load(id, transaction, true);
		const next = allow(c, 'edit', actor);
		if (c.version !== version) {
			throw new CheckError(409, 'Someone saved this check while you were editing it. Your entries are kept in the form; compare and save again.', await view(id, transaction));
		}
		const before = { state: c.state, overallGrade: c.overallGrade, priority: c.priority };
		c.set({
			checkedOn: body.checkedOn,
			reason: body.reason,
			parts: structuredClone(body.parts),
			overallGrade: overall.grade,
			overallOverrideReason: overall.overridden ? body.overallOverride!.reason : null,
			priority: body.priority,
			nextCheckDue: due,
			notes: body.notes,
			fluid,
			state: next,
		});
		await c.save({ transaction });
		await audit({ action: 'check.save', entityType: 'check', entityId: id, actorId: actor.id, before, after: { state: next, overallGrade: overall.grade, priority: body.priority, checkedOn: body.checkedOn }, clientAddress: actor.clientAddress }, transaction);
		return view(id, transaction);
	});
}

export async function submitCheck(actor: CheckActor, id: string, version: number): Promise<CheckView> {
	return db().transaction(async (transaction) => {
		const c = await load(id, transaction, true);
		const next = allow(c, 'submit', actor);
		if (c.version !== version) throw new CheckError(409, 'This check changed since you opened it; reload it before submitting.', await view(id, transaction));
		if (!c.overallGrade) throw new CheckError(400, 'Grade at least one part before submitting the check.');
		if (!c.priority) throw new CheckError(400, 'Choose a priority before submitting the check.');
		c.set({ state: next, submittedAt: new Date() });
		await c.save({ transaction });
		await audit({ action: 'check.submit', entityType: 'check', entityId: id, actorId: actor.id, before: { state: 'draft' }, after: { state: next }, clientAddress: actor.clientAddress }, transaction);
		await mailCheckSubmitted(c, transaction);
		return view(id, transaction);
	});
}

export async function reviewCheck(actor: CheckActor, id: string, decision: 'approve' | 'return', comment: string): Promise<CheckView> {
	return db().transaction(async (transaction) => {
		const c = await load(id, transaction, true);
		const next = allow(c, decision, actor);
		c.set({ state: next, reviewerId: actor.id, reviewedAt: new Date(), reviewComment: comment || null });
		await c.save({ transaction });
		if (next === 'approved') await applyToSpecimen(c, transaction);
		await audit({ action: `check.${decision}`, entityType: 'check', entityId: id, actorId: actor.id, before: { state: 'in-review' }, after: { state: next, comment }, clientAddress: actor.clientAddress }, transaction);
		await mailCheckReviewed(c, decision, transaction);
		return view(id, transaction);
	});
}

/**
 * The specimen's current condition is its latest approved check's (by date checked). A static
 * update on purpose: these derived columns are not the specimen's editable record, so they should
 * not bump its version and collide with a conservator editing the record.
 */
async function applyToSpecimen(c: ConditionCheck, transaction: Transaction) {
	const latest = await ConditionCheck.findOne({ where: { specimenId: c.specimenId, state: 'approved' }, order: [['checkedOn', 'DESC'], ['reviewedAt', 'DESC']], transaction });
	if (!latest || latest.id !== c.id) return;
	await Specimen.update(
		{ currentGrade: c.overallGrade, currentPriority: c.priority, lastCheckedOn: c.checkedOn, nextCheckDue: c.nextCheckDue },
		{ where: { id: c.specimenId }, transaction },
	);
	await audit({ action: 'specimen.condition', entityType: 'specimen', entityId: c.specimenId, actorId: c.reviewerId, after: { currentGrade: c.overallGrade, currentPriority: c.priority, lastCheckedOn: c.checkedOn, nextCheckDue: c.nextCheckDue, check: c.id } }, transaction);
}
