import { Op, QueryTypes, type WhereOptions } from 'sequelize';
import { db } from '../db.ts';
import { Specimen, User } from '../models/index.ts';
import { enqueueMail } from './outbox.ts';
import { wanting } from './preferences.ts';
import { dueDigestMail, type DigestLine } from './templates.ts';
import { publicOrigin } from './checkMail.ts';
import { registerQueryToParams } from '../../specimen/query.ts';

/**
 * The daily digest of checks coming due, to each active conservator who has not turned it off.
 * It lists every specimen of the collection whose next check is overdue or due within
 * DIGEST_DAYS, not only the ones the person examined: conservators share the collection's care,
 * and a jar nobody has examined yet would otherwise fall out of everyone's list. Each group shows
 * at most DIGEST_LIST_CAP jars with the total. Nothing is sent on a day with nothing due.
 *
 * Once per user per day: the `mail_digests` row (primary key user + date) is inserted in the same
 * transaction as the queued mail, ON CONFLICT DO NOTHING, so a second run that day, a restart or
 * a second worker finds the row and queues nothing; if the transaction fails, neither exists.
 */
export const DIGEST_DAYS = 14;
export const DIGEST_LIST_CAP = 25;
export const DIGEST_QUEUE = 'mail-due-digest';
/** 06:00 UTC every day (pg-boss cron, in the worker). */
export const DIGEST_CRON = '0 6 * * *';

const addDays = (date: string, days: number) => new Date(Date.parse(`${date}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);

async function group(where: WhereOptions<Specimen>) {
	const [rows, total] = await Promise.all([
		Specimen.findAll({ where, attributes: ['id', 'objectNumber', 'title', 'nextCheckDue'], order: [['nextCheckDue', 'ASC'], ['objectNumber', 'ASC']], limit: DIGEST_LIST_CAP }),
		Specimen.count({ where }),
	]);
	const origin = publicOrigin();
	const shown: DigestLine[] = rows.map((s) => ({ objectNumber: s.objectNumber, title: s.title, due: s.nextCheckDue!, link: `${origin}/specimens/${s.id}` }));
	return { shown, total };
}

/** Runs the digest for `date` (YYYY-MM-DD, UTC); returns how many digests it queued. */
export async function runDueDigest(date: string): Promise<number> {
	if (!/^\d{4}-\d{2}-\d{2}$/.test(date) || Number.isNaN(Date.parse(date))) throw new RangeError(`not a date: ${date}`);
	db();
	const overdue = await group({ nextCheckDue: { [Op.lt]: date } });
	const dueSoon = await group({ nextCheckDue: { [Op.between]: [date, addDays(date, DIGEST_DAYS)] } });
	if (overdue.total + dueSoon.total === 0) return 0;
	const conservators = await User.findAll({ where: { role: 'conservator', disabled: false }, attributes: ['id', 'email', 'name'], order: [['email', 'ASC']] });
	const want = await wanting('dueDigest', conservators.map((u) => u.id));
	const origin = publicOrigin();
	const facts = { date, overdue, dueSoon, days: DIGEST_DAYS, registerLink: `${origin}/specimens?${registerQueryToParams({ due: 'overdue' })}`, origin };
	let queued = 0;
	for (const u of conservators) {
		if (!want.has(u.id)) continue;
		const first = await db().transaction(async (transaction) => {
			const [rows] = await db().query('INSERT INTO mail_digests (user_id, digest_date) VALUES (:id, :date) ON CONFLICT DO NOTHING RETURNING user_id', {
				replacements: { id: u.id, date },
				type: QueryTypes.RAW,
				transaction,
			});
			if ((rows as unknown[]).length === 0) return false;
			await enqueueMail(dueDigestMail(u.email, u.name, facts), transaction);
			return true;
		});
		if (first) queued++;
	}
	return queued;
}

/** Today's date in UTC, the digest's day. */
export const digestDate = (now = new Date()) => now.toISOString().slice(0, 10);
