import { Op, type Transaction } from 'sequelize';
import { config } from '../config.ts';
import { Specimen, User, type ConditionCheck } from '../models/index.ts';
import { enqueueMail } from './outbox.ts';
import { wanting } from './preferences.ts';
import { checkApprovedMail, checkReturnedMail, checkSubmittedMail, type CheckMailFacts } from './templates.ts';

/**
 * The mail a check's transitions cause, queued in the caller's transaction (the one that changes
 * the check and writes its audit event): a rolled-back change sends nothing, and a mail server
 * that is down only delays the mail. Links are absolute, from the configured public address,
 * since the digest (no request) builds its links the same way.
 */
export const publicOrigin = () => new URL(config().MENISCUS_PUBLIC_URL).origin;

async function facts(c: ConditionCheck, transaction: Transaction): Promise<CheckMailFacts> {
	const s = (await Specimen.findByPk(c.specimenId, { transaction, attributes: ['objectNumber', 'title'] }))!;
	const origin = publicOrigin();
	return { objectNumber: s.objectNumber, title: s.title, checkedOn: c.checkedOn, link: `${origin}/checks/${c.id}`, origin };
}

const nameOf = async (id: string, transaction: Transaction) => (await User.findByPk(id, { transaction, attributes: ['name'] }))?.name ?? 'A colleague';

/** To every active reviewer but the author, who has not turned this kind off. */
export async function mailCheckSubmitted(c: ConditionCheck, transaction: Transaction): Promise<void> {
	const reviewers = await User.findAll({ where: { role: 'reviewer', disabled: false, id: { [Op.ne]: c.examinerId } }, attributes: ['id', 'email', 'name'], order: [['email', 'ASC']], transaction });
	const want = await wanting('checkSubmitted', reviewers.map((r) => r.id), transaction);
	if (want.size === 0) return;
	const f = await facts(c, transaction);
	const examiner = await nameOf(c.examinerId, transaction);
	for (const r of reviewers) if (want.has(r.id)) await enqueueMail(checkSubmittedMail(r.email, r.name, f, examiner), transaction);
}

/** To the author (if still active and not opted out), with the reviewer's comment. */
export async function mailCheckReviewed(c: ConditionCheck, decision: 'approve' | 'return', transaction: Transaction): Promise<void> {
	const author = await User.findByPk(c.examinerId, { transaction, attributes: ['id', 'email', 'name', 'disabled'] });
	if (!author || author.disabled) return;
	const kind = decision === 'approve' ? 'checkApproved' : 'checkReturned';
	if (!(await wanting(kind, [author.id], transaction)).has(author.id)) return;
	const f = await facts(c, transaction);
	const reviewer = await nameOf(c.reviewerId!, transaction);
	const mail = decision === 'approve' ? checkApprovedMail(author.email, author.name, f, reviewer, c.reviewComment) : checkReturnedMail(author.email, author.name, f, reviewer, c.reviewComment ?? '');
	await enqueueMail(mail, transaction);
}
