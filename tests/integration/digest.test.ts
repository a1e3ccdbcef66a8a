import { beforeAll, describe, expect, it } from 'vitest';
import { Op, QueryTypes } from 'sequelize';
import { baseUrl, call, useTestDatabase, waitForMail } from '../helpers/server.ts';
import { makeUser, cookieFor } from '../helpers/users.ts';
import { db } from '../../src/lib/server/db.ts';
import { OutgoingMail, Specimen } from '../../src/lib/server/models/index.ts';
import { DIGEST_LIST_CAP, runDueDigest } from '../../src/lib/server/mail/digest.ts';

/**
 * The daily digest of checks coming due, run for a given date: once per user per day however
 * often it is triggered (also twice at once), to conservators who left it on, with overdue jars
 * and jars due within 14 days counted and listed (capped).
 */
// A date of this run's own, far from today, so the worker's real 06:00 run cannot share its key.
const date = `2031-0${1 + (process.pid % 9)}-1${process.pid % 10}`;
const plus14 = new Date(Date.parse(`${date}T00:00:00Z`) + 14 * 86_400_000).toISOString().slice(0, 10);
let keen = { id: '', email: '' };
let off = { id: '', email: '' };

const digests = (to: string) => OutgoingMail.findAll({ where: { toAddress: to, subject: { [Op.startsWith]: 'Checks coming due' } } });

beforeAll(async () => {
	useTestDatabase();
	db();
	keen = (await makeUser('conservator', { tag: 'digest-keen' })).user;
	off = (await makeUser('conservator', { tag: 'digest-off' })).user;
	const res = await call('/api/me/mail-preferences', { cookie: await cookieFor(off.id), method: 'PATCH', json: { dueDigest: false } });
	expect(res.status).toBe(200);
});

describe('the due digest', () => {
	it('is sent once per user per day even when triggered twice at once and again later', async () => {
		const t0 = new Date();
		const [first, second] = await Promise.all([runDueDigest(date), runDueDigest(date)]);
		expect(first + second).toBeGreaterThan(0);
		// Run again later: only conservators that other test files created meanwhile can get one now.
		const again = await runDueDigest(date);
		const newcomers = await db().query<{ n: number }>(`SELECT count(*)::int AS n FROM users WHERE role = 'conservator' AND created_at >= :t0`, { replacements: { t0 }, type: QueryTypes.SELECT });
		expect(again).toBeLessThanOrEqual(newcomers[0]!.n);
		const rows = await db().query<{ n: number }>('SELECT count(*)::int AS n FROM mail_digests WHERE user_id = :id AND digest_date = :date', { replacements: { id: keen.id, date }, type: QueryTypes.SELECT });
		expect(rows[0]!.n).toBe(1);
		expect(await digests(keen.email)).toHaveLength(1);
		expect(await digests(off.email)).toHaveLength(0);
	});

	it('counts and lists the overdue jars and those due within 14 days, capped, with links', async () => {
		const overdue = await Specimen.count({ where: { nextCheckDue: { [Op.lt]: date } } });
		const soon = await Specimen.count({ where: { nextCheckDue: { [Op.between]: [date, plus14] } } });
		const mail = await waitForMail(keen.email, /^Checks coming due/);
		expect(mail.subject).toBe(`Checks coming due: ${overdue} overdue, ${soon} within 14 days`);
		expect(mail.text).toContain(`as of ${date}`);
		expect(mail.text).toContain(`Overdue (${overdue}):`);
		const listed = mail.text.split('\n').filter((l) => l.startsWith('- ')).length;
		expect(listed).toBe(Math.min(overdue, DIGEST_LIST_CAP) + Math.min(soon, DIGEST_LIST_CAP));
		if (overdue > DIGEST_LIST_CAP) expect(mail.text).toContain(`… and ${overdue - DIGEST_LIST_CAP} more.`);
		expect(mail.text).toMatch(new RegExp(`${baseUrl().replaceAll('.', '\\.')}/specimens/[0-9a-f-]{36}`));
		expect(mail.text).toContain(`${baseUrl()}/specimens?due=overdue`);
		expect(mail.html).toContain('<ul><li>');
	});

	it('refuses a date that is not one', async () => {
		await expect(runDueDigest('tomorrow')).rejects.toThrow(RangeError);
	});
});
