import { beforeAll, describe, expect, it } from 'vitest';
import { call, baseUrl, useTestDatabase, waitForMail } from '../helpers/server.ts';
import { cookieFor, makeUser } from '../helpers/users.ts';
import { gradedCheck, newSpecimen, submittedCheck } from '../helpers/checks.ts';
import { db } from '../../src/lib/server/db.ts';
import { ConditionCheck, OutgoingMail } from '../../src/lib/server/models/index.ts';
import { mailCheckSubmitted } from '../../src/lib/server/mail/checkMail.ts';

/**
 * Mail caused by a check's transitions (issue 8): submitted → every active reviewer but the author;
 * returned (with the comment) and approved → the author; each kind only to those who left it on.
 */
type Person = { id: string; email: string; cookie: string };
const nobody: Person = { id: '', email: '', cookie: '' };
const people = { author: nobody, quiet: nobody, reviewer: nobody, deaf: nobody };

async function person(role: 'conservator' | 'reviewer', tag: string): Promise<Person> {
	const { user } = await makeUser(role, { tag });
	return { id: user.id, email: user.email, cookie: await cookieFor(user.id) };
}

const queued = (to: string, subject: RegExp) =>
	OutgoingMail.findAll({ where: { toAddress: to } }).then((rows) => rows.filter((r) => subject.test(r.subject)));
const turnOff = (p: Person, kind: string) => call('/api/me/mail-preferences', { cookie: p.cookie, method: 'PATCH', json: { [kind]: false } });
const review = (id: string, decision: string, comment: string, who: Person) => call(`/api/checks/${id}/review`, { cookie: who.cookie, json: { decision, comment } });
const subjectFor = (objectNumber: string, what: string) => new RegExp(`^Check of ${objectNumber.replaceAll('.', '\\.')} ${what}$`);

beforeAll(async () => {
	useTestDatabase();
	db();
	people.author = await person('conservator', 'mail-author');
	people.quiet = await person('conservator', 'mail-quiet');
	people.reviewer = await person('reviewer', 'mail-rev');
	people.deaf = await person('reviewer', 'mail-deaf');
	expect((await turnOff(people.deaf, 'checkSubmitted')).status).toBe(200);
	expect((await turnOff(people.quiet, 'checkApproved')).status).toBe(200);
});

describe('mail about condition checks', () => {
	it('tells the reviewers, not the author, that a check waits; returns and approvals reach the author', async () => {
		const { author, reviewer, deaf } = people;
		const s = await newSpecimen(author.cookie, `ML${process.pid}`);
		const c = await submittedCheck(author.cookie, s.id);
		const link = `${baseUrl()}/checks/${c.id}`;

		const waiting = await waitForMail(reviewer.email, subjectFor(s.objectNumber, 'waiting for review'));
		expect(waiting.text).toContain(link);
		expect(waiting.text).toContain('Test conservator');
		expect(waiting.html).toContain(`href="${link}"`);
		expect(await queued(author.email, /waiting for review/)).toHaveLength(0);
		expect(await queued(deaf.email, subjectFor(s.objectNumber, 'waiting for review'))).toHaveLength(0);
		// The demo reviewer is a reviewer too.
		await waitForMail('reviewer@example.org', subjectFor(s.objectNumber, 'waiting for review'));

		const comment = 'Measure the fluid level against the base mark & resubmit <please>.';
		expect((await review(c.id, 'return', comment, reviewer)).status).toBe(200);
		const returned = await waitForMail(author.email, subjectFor(s.objectNumber, 'returned with comments'));
		expect(returned.text).toContain(`> ${comment}`);
		expect(returned.text).toContain(link);
		expect(returned.html).toContain('&#38; resubmit &#60;please&#62;');
		expect(returned.html).not.toContain('<please>');

		// Edited back to a draft, submitted again: the reviewers hear of it a second time.
		const view = (await (await call(`/api/checks/${c.id}`, { cookie: author.cookie })).json()).check;
		const saved = (await (await call(`/api/checks/${c.id}`, { cookie: author.cookie, method: 'PUT', json: { version: view.version, check: gradedCheck('Level re-measured.') } })).json()).check;
		expect((await call(`/api/checks/${c.id}/submit`, { cookie: author.cookie, json: { version: saved.version } })).status).toBe(200);
		await expect.poll(async () => (await queued(reviewer.email, subjectFor(s.objectNumber, 'waiting for review'))).length).toBe(2);

		expect((await review(c.id, 'approve', '', reviewer)).status).toBe(200);
		const approved = await waitForMail(author.email, subjectFor(s.objectNumber, 'approved'));
		expect(approved.text).toContain(link);
		expect(approved.text).toContain('Test reviewer has approved your condition check');
	});

	it('sends nobody a kind they turned off, and still sends them the other kinds', async () => {
		const { quiet, reviewer } = people;
		const s = await newSpecimen(quiet.cookie, `MQ${process.pid}`);
		const first = await submittedCheck(quiet.cookie, s.id);
		expect((await review(first.id, 'approve', 'Fine.', reviewer)).status).toBe(200);
		const second = await submittedCheck(quiet.cookie, s.id);
		expect((await review(second.id, 'return', 'Photograph the label, please.', reviewer)).status).toBe(200);
		await waitForMail(quiet.email, subjectFor(s.objectNumber, 'returned with comments'));
		expect(await queued(quiet.email, subjectFor(s.objectNumber, 'approved'))).toHaveLength(0);
	});

	it('queues nothing when the change rolls back, nor for a refused transition', async () => {
		const { author, reviewer } = people;
		const s = await newSpecimen(author.cookie, `MR${process.pid}`);
		const c = await submittedCheck(author.cookie, s.id);
		const subject = subjectFor(s.objectNumber, 'waiting for review');
		await expect.poll(async () => (await queued(reviewer.email, subject)).length).toBe(1);
		// The same mail, queued in a transaction that then fails, leaves no trace.
		const row = (await ConditionCheck.findByPk(c.id))!;
		await expect(
			db().transaction(async (t) => {
				await mailCheckSubmitted(row, t);
				throw new Error('the change failed');
			}),
		).rejects.toThrow('the change failed');
		// A second submit is refused (it is in review already): no mail either.
		expect((await call(`/api/checks/${c.id}/submit`, { cookie: author.cookie, json: { version: c.version } })).status).toBe(403);
		expect(await queued(reviewer.email, subject)).toHaveLength(1);
	});
});
