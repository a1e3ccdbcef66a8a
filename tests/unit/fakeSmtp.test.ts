import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { createTransport } from 'nodemailer';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import {
	clearMailbox,
	MAX_MESSAGE_BYTES,
	readMailbox,
	startFakeSmtp,
	type FakeSmtp,
} from '../../src/lib/server/mail/fakeSmtp.ts';

describe('fake SMTP server', () => {
	let tmpRoot: string;
	let mailboxDir: string;
	let smtp: FakeSmtp;
	const logged: string[] = [];

	const send = (message: Parameters<ReturnType<typeof createTransport>['sendMail']>[0]) =>
		createTransport({ host: '127.0.0.1', port: smtp.port, secure: false, ignoreTLS: true }).sendMail(message);

	beforeAll(async () => {
		tmpRoot = await mkdtemp(path.join(os.tmpdir(), 'meniscus-fake-smtp-'));
		// A subdirectory that does not exist yet: startFakeSmtp must create it
		mailboxDir = path.join(tmpRoot, 'mailbox');
		smtp = await startFakeSmtp({ mailboxDir, log: (line) => logged.push(line) });
	});

	afterAll(async () => {
		await smtp?.close();
		await rm(tmpRoot, { recursive: true, force: true });
	});

	beforeEach(async () => {
		await clearMailbox(mailboxDir);
		logged.length = 0;
	});

	it('stores a message with a UTF-8 subject and keeps injection-looking body text as text', async () => {
		const subject = 'Fluid top-up due — Jar №42 «Octopus vulgaris» ✓';
		// A bare "." line would end DATA and a header-looking line could smuggle a Bcc
		// if the client or server mishandled CR/LF; both must survive as plain body text
		const injected = 'Bcc: attacker@example.com\r\n.\r\nMAIL FROM:<evil@example.com>';
		await send({
			from: 'Meniscus <noreply@meniscus.test>',
			to: 'Curator <curator@example.org>',
			subject,
			text: `Hello,\r\n${injected}\r\nBye`,
		});

		const messages = await readMailbox(mailboxDir);
		expect(messages).toHaveLength(1);
		const message = messages[0];
		if (!message) throw new Error('no message stored');
		expect(message.subject).toBe(subject);
		// mailparser's formatted address text quotes display names
		expect(message.to).toBe('"Curator" <curator@example.org>');
		expect(message.from).toBe('"Meniscus" <noreply@meniscus.test>');
		expect(message.envelopeFrom).toBe('noreply@meniscus.test');
		expect(message.envelopeTo).toEqual(['curator@example.org']);
		expect(message.text.replace(/\r\n/g, '\n').trim()).toBe(`Hello,\n${injected.replace(/\r\n/g, '\n')}\nBye`);
		expect(message.html).toBeNull();
		expect(new Date(message.receivedAt).getTime()).not.toBeNaN();
	});

	it('keeps the names of the header lines, so a test sees one that was smuggled in', async () => {
		// A raw message, as a client that let a line break into a header would send it.
		const raw = 'From: noreply@meniscus.test\r\nTo: curator@example.org\r\nSubject: Check of X\r\nBcc: intruder@example.org\r\n\r\nHello\r\n';
		await send({ envelope: { from: 'noreply@meniscus.test', to: ['curator@example.org'] }, raw });
		const [message] = await readMailbox(mailboxDir);
		expect(message?.headers).toEqual(['from', 'to', 'subject', 'bcc']);
	});

	it('refuses a message over the size limit with 552 and stores nothing', async () => {
		await expect(
			send({
				from: 'noreply@meniscus.test',
				to: 'curator@example.org',
				subject: 'too big',
				text: 'x'.repeat(MAX_MESSAGE_BYTES + 1024),
			}),
		).rejects.toMatchObject({ responseCode: 552 });
		expect(await readMailbox(mailboxDir)).toEqual([]);
		// nodemailer sends no SIZE= here, so the refusal came after DATA, from onData
		expect(logged.some((line) => line.includes('exceeds'))).toBe(true);
	}, 30_000);

	it('returns messages newest first, honours limit and skips garbled files', async () => {
		for (const subject of ['first', 'second']) {
			await send({ from: 'noreply@meniscus.test', to: 'curator@example.org', subject, text: subject, html: `<p>${subject}</p>` });
			// File names carry millisecond timestamps; keep the two apart
			await new Promise((resolve) => setTimeout(resolve, 5));
		}
		await writeFile(path.join(mailboxDir, '9999-garbled.json'), '{not json');
		await writeFile(path.join(mailboxDir, '9999-invalid.json'), JSON.stringify({ id: 1 }));

		const messages = await readMailbox(mailboxDir);
		expect(messages.map((m) => m.subject)).toEqual(['second', 'first']);
		expect(messages[0]?.html).toBe('<p>second</p>');
		expect((await readMailbox(mailboxDir, { limit: 1 })).map((m) => m.subject)).toEqual(['second']);
	});

	it('accepts a client that sends credentials', async () => {
		const transport = createTransport({
			host: '127.0.0.1',
			port: smtp.port,
			secure: false,
			ignoreTLS: true,
			auth: { user: 'dev', pass: 'dev' },
		});
		await transport.sendMail({ from: 'noreply@meniscus.test', to: 'curator@example.org', subject: 'with auth', text: 'hi' });
		expect((await readMailbox(mailboxDir)).map((m) => m.subject)).toEqual(['with auth']);
	});

	it('returns [] for a mailbox directory that does not exist', async () => {
		expect(await readMailbox(path.join(tmpRoot, 'does-not-exist'))).toEqual([]);
	});

	it('refuses to listen on a non-loopback interface', async () => {
		await expect(startFakeSmtp({ host: '0.0.0.0', mailboxDir })).rejects.toThrow(/loopback/);
	});
});
