import { Op, type Transaction } from 'sequelize';
import { Specimen, User, type Treatment } from '../models/index.ts';
import { enqueueMail } from './outbox.ts';
import { wanting } from './preferences.ts';
import { publicOrigin } from './checkMail.ts';
import { riskReviewedMail, riskSubmittedMail, type RiskMailFacts } from './templates.ts';
import { HAZARD_LABELS } from '../../treatment/hazards.ts';
import { BAND_LABELS, bandOf } from '../../treatment/risk.ts';

/**
 * The mail a risk assessment's review causes, queued in the transaction that changes it (as for
 * checks, src/lib/server/mail/checkMail.ts): asking for sign-off mails the reviewers but the
 * author; the sign-off or return mails the author.
 */
async function facts(t: Treatment, transaction: Transaction): Promise<RiskMailFacts> {
	const s = (await Specimen.findByPk(t.specimenId, { transaction, attributes: ['objectNumber', 'title'] }))!;
	const origin = publicOrigin();
	return { objectNumber: s.objectNumber, title: s.title, treatment: t.title, link: `${origin}/treatments/${t.id}`, origin };
}

export async function mailRiskSubmitted(t: Treatment, transaction: Transaction): Promise<void> {
	const reviewers = await User.findAll({ where: { role: 'reviewer', disabled: false, id: { [Op.ne]: t.createdBy } }, attributes: ['id', 'email', 'name'], order: [['email', 'ASC']], transaction });
	const want = await wanting('riskSubmitted', reviewers.map((r) => r.id), transaction);
	if (want.size === 0) return;
	const f = await facts(t, transaction);
	const author = (await User.findByPk(t.createdBy, { transaction, attributes: ['name'] }))?.name ?? 'A colleague';
	const hazards = t.risk.hazards.map((h) => `${HAZARD_LABELS[h.kind]}: residual ${BAND_LABELS[bandOf(h.residual)].toLowerCase()}`);
	for (const r of reviewers) if (want.has(r.id)) await enqueueMail(riskSubmittedMail(r.email, r.name, f, author, hazards), transaction);
}

export async function mailRiskReviewed(t: Treatment, decision: 'sign-off' | 'return', transaction: Transaction): Promise<void> {
	const author = await User.findByPk(t.createdBy, { transaction, attributes: ['id', 'email', 'name', 'disabled'] });
	if (!author || author.disabled) return;
	if (!(await wanting('riskReviewed', [author.id], transaction)).has(author.id)) return;
	const f = await facts(t, transaction);
	const reviewer = (await User.findByPk(t.riskReviewerId!, { transaction, attributes: ['name'] }))?.name ?? 'A reviewer';
	await enqueueMail(riskReviewedMail(author.email, author.name, f, reviewer, decision, t.riskReviewComment), transaction);
}
