import { beforeAll, describe, expect, inject, it } from 'vitest';
import { call, useTestDatabase, waitForMail } from '../helpers/server.ts';
import { makeUser, signedInUser } from '../helpers/users.ts';
import { newSpecimen, submittedCheck } from '../helpers/checks.ts';
import { specimenRecord } from '../helpers/specimens.ts';
import { db } from '../../src/lib/server/db.ts';
import { readMailbox } from '../../src/lib/server/mail/fakeSmtp.ts';

/**
 * TESTPLAN B6, mail (ASVS 5.0 1.3.11 no SMTP/IMAP injection): the values that reach a mail header
 * are the object number (subjects) and people's names and addresses. Line breaks there are refused
 * at the API, and even a record that holds one (written past the API, as an old import might) gives
 * a one-line subject and no extra header. The fake SMTP server keeps each message's header names.
 * (signin.test.ts refuses a line break in a name changed by an administrator.)
 */
let conservator: string;
let admin: string;
const INJECTED = '\r\nBcc: intruder@example.org\r\nX-Injected: yes';

beforeAll(async () => {
	useTestDatabase();
	({ cookie: conservator } = await signedInUser('conservator', 'crlf-c'));
	({ cookie: admin } = await signedInUser('admin', 'crlf-a'));
});

describe('line breaks in values that reach mail headers', () => {
	it('are refused in an object number, a new person’s name and address', async () => {
		for (const objectNumber of [`CRLF.1${INJECTED}`, `CRLF.2\nBcc: intruder@example.org`]) {
			expect((await call('/api/specimens', { cookie: conservator, json: specimenRecord('x', { objectNumber }) })).status, JSON.stringify(objectNumber)).toBe(400);
		}
		// A line break at either end is trimmed away, not stored.
		const trimmed = await call('/api/specimens', { cookie: conservator, json: specimenRecord('x', { objectNumber: `\r\nCRLF.${process.pid}\r\n` }) });
		expect((await trimmed.json()).specimen.objectNumber).toBe(`CRLF.${process.pid}`);
		for (const person of [{ name: `Mallory${INJECTED}`, email: `mallory-${process.pid}@example.org` }, { name: 'Mallory', email: `mallory-${process.pid}@example.org${INJECTED}` }]) {
			expect((await call('/api/users', { cookie: admin, json: { ...person, role: 'conservator' } })).status, JSON.stringify(person)).toBe(400);
		}
	});

	it('never split a subject into headers, even when a stored record holds them', async () => {
		const reviewer = (await makeUser('reviewer', { tag: 'crlf-r' })).user;
		const s = await newSpecimen(conservator, `CR${process.pid}`);
		// Past the API, which refuses it: the object number column itself takes any text.
		const stored = `CR${process.pid}\r\nBcc: intruder@example.org`;
		await db().query(`UPDATE specimens SET object_number = :stored WHERE id = :id`, { replacements: { stored, id: s.id } });
		await submittedCheck(conservator, s.id);
		const mail = await waitForMail(reviewer.email, new RegExp(`^Check of CR${process.pid}`));
		expect(mail.subject).toBe(`Check of ${stored.replace(/[\r\n]+/g, ' ')} waiting for review`);
		expect(mail.headers).not.toContain('bcc');
		expect(mail.headers.filter((h) => h === 'subject')).toHaveLength(1);
		expect(mail.envelopeTo).toEqual([reviewer.email]);
		expect((await readMailbox(inject('mailboxDir'))).filter((m) => m.envelopeTo.includes('intruder@example.org'))).toEqual([]);
	});
});
