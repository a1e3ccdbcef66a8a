import { OptimisticLockError, type Transaction } from 'sequelize';
import { db } from '../db.ts';
import { ConditionCheck, Photo, PhotoComparison, Specimen, User } from '../models/index.ts';
import { audit } from '../audit.ts';
import type { SignedInUser } from '../auth/lucia.ts';
import { analysePair, summaryOf, type ComparisonSummary } from '../../compare/analysis.ts';
import type { Matrix3 } from '../../compare/registration.ts';
import type { ComparisonInput, ControlPair } from '../../compare/schema.ts';
import type { ComparisonListItem, ComparisonView } from '../../compare/view.ts';
import { comparablePhotos, comparedPhoto, type Comparable } from './comparable.ts';
import { CompareError } from './error.ts';
import { measureFluidColour } from './fluidColour.ts';
import { comparisonListItem, comparisonView, type ListedComparison, type LoadedComparison } from './presenter.ts';

/**
 * Saved comparisons of two photographs of one specimen. On every save the server loads both
 * photographs' current layers, check data and fluid colour and runs the same analysis the island
 * runs (src/lib/compare/analysis.ts), so the stored summary is what the pair shows now, never
 * what a client claims. An update names the version it started from; a stale one changes nothing
 * and gets the comparison as it is (409). Each change commits with its audit event.
 */
export interface CompareActor extends SignedInUser {
	clientAddress: string | null;
}

const people = [
	{ model: User, as: 'creator', attributes: ['id', 'name'] },
	{ model: User, as: 'updater', attributes: ['id', 'name'] },
];
const datedPhoto = (as: 'before' | 'after') => ({ model: Photo, as, attributes: ['id', 'checkId', 'capturedAt', 'uploadedAt'], include: [{ model: ConditionCheck, as: 'check', attributes: ['id', 'checkedOn'] }] });

async function view(id: string, transaction?: Transaction): Promise<ComparisonView | null> {
	const c = (await PhotoComparison.findByPk(id, { include: people, transaction })) as LoadedComparison | null;
	return c ? comparisonView(c) : null;
}

async function specimenOrThrow(id: string): Promise<void> {
	if (!(await Specimen.findByPk(id, { attributes: ['id'] }))) throw new CompareError(404, 'No such specimen.');
}

export async function getComparison(id: string): Promise<ComparisonView> {
	const found = await view(id);
	if (!found) throw new CompareError(404, 'No such comparison.');
	return found;
}

/** A specimen's saved comparisons, newest first. */
export async function listComparisons(specimenId: string): Promise<ComparisonListItem[]> {
	await specimenOrThrow(specimenId);
	const rows = (await PhotoComparison.findAll({
		where: { specimenId },
		include: [...people, datedPhoto('before'), datedPhoto('after')],
		order: [['createdAt', 'DESC'], ['id', 'ASC']],
	})) as ListedComparison[];
	return rows.map(comparisonListItem);
}

function outside(pairs: readonly ControlPair[], side: 'before' | 'after', p: Comparable): string | null {
	const bad = pairs.find(({ [side]: [x, y] }) => x < 0 || y < 0 || x > p.photo.width || y > p.photo.height);
	return bad ? `Control point ${bad.n} is outside the ${side === 'before' ? 'earlier' : 'later'} photograph (${p.photo.width} × ${p.photo.height} px); place it on the photograph.` : null;
}

/** The stored columns for an input: the server's own analysis of the two photographs as they are now. */
async function analyse(specimenId: string, input: ComparisonInput) {
	const found = await comparablePhotos({ id: [input.beforePhotoId, input.afterPhotoId] });
	const pick = (id: string, which: string) => {
		const p = found.find((c) => c.photo.id === id);
		if (!p) throw new CompareError(400, `The ${which} photograph does not exist or is still being processed; choose another.`);
		if (p.photo.specimenId !== specimenId) throw new CompareError(400, `The ${which} photograph is of another specimen; compare two photographs of this one.`);
		return p;
	};
	const before = pick(input.beforePhotoId, 'earlier');
	const after = pick(input.afterPhotoId, 'later');
	const why = outside(input.controlPoints, 'before', before) ?? outside(input.controlPoints, 'after', after);
	if (why) throw new CompareError(400, why);
	const [colourBefore, colourAfter] = await Promise.all([measureFluidColour(before), measureFluidColour(after)]);
	let summary: ComparisonSummary;
	let transform: Matrix3 | null;
	try {
		const analysis = analysePair(comparedPhoto(before), comparedPhoto(after), input.model, input.controlPoints, { before: colourBefore, after: colourAfter });
		if (analysis.registration.problem) throw new CompareError(400, `The control points cannot be used: ${analysis.registration.problem}`);
		transform = analysis.registration.transform;
		// Through JSON once, so what is returned now is what a later read returns (no NaN or Infinity).
		summary = JSON.parse(JSON.stringify(summaryOf(analysis))) as ComparisonSummary;
	} catch (err) {
		if (err instanceof RangeError) throw new CompareError(400, err.message);
		throw err;
	}
	return {
		beforePhotoId: before.photo.id,
		afterPhotoId: after.photo.id,
		model: input.model,
		controlPoints: input.controlPoints.map((p) => ({ n: p.n, before: [p.before[0], p.before[1]] as [number, number], after: [p.after[0], p.after[1]] as [number, number] })),
		transform,
		summary,
		note: input.note,
	};
}

/** What the audit trail keeps of a comparison: which photographs, how aligned, what changed. */
const auditOf = (c: Pick<PhotoComparison, 'beforePhotoId' | 'afterPhotoId' | 'model' | 'controlPoints' | 'summary' | 'version'>) => ({
	beforePhotoId: c.beforePhotoId,
	afterPhotoId: c.afterPhotoId,
	model: c.model,
	pairs: c.controlPoints.length,
	counts: c.summary.counts,
	version: c.version,
});

export async function createComparison(actor: CompareActor, specimenId: string, input: ComparisonInput): Promise<ComparisonView> {
	await specimenOrThrow(specimenId);
	// The analysis reads files and layers; it runs before the transaction so no connection waits on it.
	const values = await analyse(specimenId, input);
	return db().transaction(async (transaction) => {
		const c = await PhotoComparison.create({ ...values, specimenId, createdBy: actor.id, updatedBy: actor.id }, { transaction });
		await audit({ action: 'comparison.created', entityType: 'comparison', entityId: c.id, actorId: actor.id, clientAddress: actor.clientAddress, after: { specimenId, ...auditOf(c) } }, transaction);
		return (await view(c.id, transaction))!;
	});
}

export async function updateComparison(actor: CompareActor, id: string, version: number, input: ComparisonInput): Promise<ComparisonView> {
	const existing = await PhotoComparison.findByPk(id, { attributes: ['id', 'specimenId'] });
	if (!existing) throw new CompareError(404, 'No such comparison.');
	const stale = async (transaction?: Transaction) =>
		new CompareError(409, 'Someone saved this comparison after you opened it; compare yours with it as it is now and save again.', (await view(id, transaction))!);
	const values = await analyse(existing.specimenId, input);
	try {
		return await db().transaction(async (transaction) => {
			const c = await PhotoComparison.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
			if (!c) throw new CompareError(404, 'No such comparison.');
			if (c.version !== version) throw await stale(transaction);
			const before = auditOf(c);
			// Fresh values for the JSONB columns, so Sequelize writes them (STACK.md); instance save keeps the version check.
			c.set({ ...values, updatedBy: actor.id });
			c.changed('summary', true);
			c.changed('controlPoints', true);
			await c.save({ transaction });
			await audit({ action: 'comparison.updated', entityType: 'comparison', entityId: id, actorId: actor.id, clientAddress: actor.clientAddress, before, after: auditOf(c) }, transaction);
			return (await view(id, transaction))!;
		});
	} catch (err) {
		if (err instanceof OptimisticLockError) throw await stale();
		throw err;
	}
}
