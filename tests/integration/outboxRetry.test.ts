import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, inject, it, vi } from 'vitest';
import { createDatabase } from '../../db/cluster.mjs';
import { migrateUp } from '../../db/migrate.ts';
import { openSequelize } from '../../src/lib/server/db.ts';
import { readMailbox, startFakeSmtp, type FakeSmtp } from '../../src/lib/server/mail/fakeSmtp.ts';

/**
 * TESTPLAN F8, SMTP down: a change commits with its mail while the mail server is stopped; the
 * message stays queued and is delivered once the server is back, exactly once, even with two
 * senders. On a database and a fake SMTP server of this file's own, so the app's sender (which
 * shares the main outbox) cannot take the messages.
 */
const name = `outbox_${process.pid}`;
const mailboxDir = fs.mkdtempSync(path.join(os.tmpdir(), 'meniscus-outbox-'));
let smtp: FakeSmtp | undefined;
let port = 0;
type Outbox = typeof import('../../src/lib/server/mail/outbox.ts');
type Models = typeof import('../../src/lib/server/models/index.ts');
let outbox: Outbox;
let models: Models;
let dbModule: typeof import('../../src/lib/server/db.ts');

const mails = async (subject: string) => (await readMailbox(mailboxDir)).filter((m) => m.subject === subject);

beforeAll(async () => {
	await createDatabase({ dataDir: inject('clusterDataDir'), port: inject('clusterPort'), name });
	const url = inject('databaseUrl').replace(/\/[^/]+$/, `/${name}`);
	const migrator = openSequelize(url);
	await migrateUp(migrator);
	await migrator.close();
	smtp = await startFakeSmtp({ mailboxDir, log: () => {} });
	port = smtp.port;
	// Before any server module reads its settings (config() is read once per module graph).
	Object.assign(process.env, { DATABASE_URL: url, SMTP_HOST: '127.0.0.1', SMTP_PORT: String(port), MENISCUS_PUBLIC_URL: inject('baseUrl') });
	outbox = await import('../../src/lib/server/mail/outbox.ts');
	models = await import('../../src/lib/server/models/index.ts');
	dbModule = await import('../../src/lib/server/db.ts');
	dbModule.db();
});

afterAll(async () => {
	await smtp?.close();
	await dbModule?.closeDb();
	fs.rmSync(mailboxDir, { recursive: true, force: true });
});

describe('the outbox while the mail server is down', () => {
	it('commits the change, keeps the mail queued, and delivers it once when the server is back', async () => {
		await smtp!.close();
		smtp = undefined;
		const subject = `Down-time message ${Date.now()}`;
		const user = await dbModule.db().transaction(async (transaction) => {
			const u = await models.User.create({ email: `down-${Date.now()}@example.org`, name: 'Down Time', role: 'reviewer', passwordHash: null, lastSignInAt: null }, { transaction });
			await outbox.enqueueMail({ to: u.email, subject, text: 'Still here.', html: '<p>Still here.</p>' }, transaction);
			return u;
		});
		// The record is there at once: the mail server did not hold it up.
		expect(await models.User.findByPk(user.id)).not.toBeNull();
		await outbox.deliverDue();
		const row = (await models.OutgoingMail.findOne({ where: { subject } }))!;
		expect(row).toMatchObject({ status: 'queued', sentAt: null });
		expect(row.attempts).toBeGreaterThanOrEqual(1);
		expect(row.lastError).toBeTruthy();
		expect(row.nextAttemptAt.getTime()).toBeGreaterThan(Date.now());

		smtp = await startFakeSmtp({ mailboxDir, port, log: () => {} });
		// The retry is due later; ask as if that time had come.
		const later = new Date(Date.now() + 10 * 60_000);
		expect(await outbox.deliverDue(later)).toBe(1);
		expect(await outbox.deliverDue(later)).toBe(0);
		const got = await mails(subject);
		expect(got).toHaveLength(1);
		expect(got[0]!.envelopeTo).toEqual([user.email]);
		expect(got[0]!.text.trim()).toBe('Still here.');
		expect(got[0]!.html).toContain('<p>Still here.</p>');
		await row.reload();
		expect(row).toMatchObject({ status: 'sent', lastError: null });
	});

	it('never sends a message twice when two senders pass at the same time', async () => {
		const subject = `Two senders ${Date.now()}`;
		await dbModule.db().transaction(async (transaction) => {
			for (let i = 0; i < 12; i++) await outbox.enqueueMail({ to: `two-${i}@example.org`, subject, text: `Message ${i}` }, transaction);
		});
		// A second copy of the modules: its own connection pool and its own sender, as another process has.
		vi.resetModules();
		const other: Outbox = await import('../../src/lib/server/mail/outbox.ts');
		await Promise.all([outbox.deliverDue(), other.deliverDue(), outbox.deliverDue()]);
		await expect.poll(async () => (await mails(subject)).length).toBe(12);
		const got = await mails(subject);
		expect(new Set(got.map((m) => m.envelopeTo[0])).size).toBe(12);
		expect(await models.OutgoingMail.count({ where: { subject, status: 'sent' } })).toBe(12);
		await (await import('../../src/lib/server/db.ts')).closeDb();
	});
});
