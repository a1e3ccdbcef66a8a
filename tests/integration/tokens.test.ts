import { beforeAll, describe, expect, it } from 'vitest';
import { call, linkIn, signIn, uniqueEmail, useTestDatabase, waitForMail } from '../helpers/server.ts';
import { makeUser } from '../helpers/users.ts';
import { db } from '../../src/lib/server/db.ts';
import { AuthToken, OutgoingMail, User } from '../../src/lib/server/models/index.ts';
import { consumeToken, findValidToken, issueToken } from '../../src/lib/server/auth/tokens.ts';

/** Invitations and password resets: e-mailed links through the real outbox and fake SMTP server. */
beforeAll(() => {
	useTestDatabase();
	db();
});

describe('password reset by e-mail', () => {
	it('mails a single-use link that sets a new password and signs the old sessions out', async () => {
		const { user, password } = await makeUser('conservator');
		const res = await call('/reset', { form: { email: user.email } });
		expect(res.status).toBe(200);
		expect(await res.text()).toMatch(/If an active account uses that address/);
		const mail = await waitForMail(user.email, /Reset your Meniscus password/);
		const link = linkIn(mail.text);

		expect((await call(link)).status).toBe(200);
		const weak = await call(link, { form: { password: 'short', confirm: 'short' } });
		expect(weak.status).toBe(400);
		// A refused password leaves the link usable.
		const next = 'a new and longer jar password';
		const ok = await call(link, { form: { password: next, confirm: next } });
		expect(ok.status).toBe(200);
		expect(await ok.text()).toMatch(/Your password is set/);

		expect((await call('/login', { form: { email: user.email, password } })).status).toBe(401);
		expect((await call('/login', { form: { email: user.email, password: next } })).status).toBe(303);

		const again = await call(link, { form: { password: 'yet another jar password', confirm: 'yet another jar password' } });
		expect(again.status).toBe(410);
		expect(await again.text()).toMatch(/This link no longer works/);
	});

	it('answers the same for an address without an account, and sends nothing', async () => {
		const email = uniqueEmail('absent');
		const res = await call('/reset', { form: { email } });
		expect(res.status).toBe(200);
		expect(await res.text()).toMatch(/If an active account uses that address/);
		expect(await OutgoingMail.count({ where: { toAddress: email } })).toBe(0);
	});

	it('refuses an expired link and a used one at the database level', async () => {
		const { user } = await makeUser('reviewer');
		const t0 = new Date();
		const token = await issueToken(user.id, 'reset', 60_000, undefined, t0);
		expect(await findValidToken(token, new Date(t0.getTime() + 59_000))).not.toBeNull();
		expect(await findValidToken(token, new Date(t0.getTime() + 61_000))).toBeNull();
		const late = await db().transaction((tx) => consumeToken(token, tx, new Date(t0.getTime() + 61_000)));
		expect(late).toBeNull();
		const first = await db().transaction((tx) => consumeToken(token, tx, t0));
		expect(first).toEqual({ userId: user.id, purpose: 'reset' });
		expect(await db().transaction((tx) => consumeToken(token, tx, t0))).toBeNull();
	});

	it('lets only one of two simultaneous uses of a link succeed', async () => {
		const { user } = await makeUser('reviewer');
		const token = await issueToken(user.id, 'reset', 60_000);
		const results = await Promise.all([1, 2, 3].map(() => db().transaction((tx) => consumeToken(token, tx))));
		expect(results.filter(Boolean)).toHaveLength(1);
	});

	it('keeps only a hash of the token', async () => {
		const { user } = await makeUser('curator');
		const token = await issueToken(user.id, 'reset', 60_000);
		const rows = await AuthToken.findAll({ where: { userId: user.id } });
		expect(rows.map((r) => r.tokenHash)).not.toContain(token);
		expect(rows[0]!.tokenHash).toMatch(/^[0-9a-f]{64}$/);
	});
});

describe('invitations', () => {
	it('an administrator invites a person, who sets a password from the e-mail and signs in', async () => {
		const admin = await signIn('admin@example.org');
		const email = uniqueEmail('invitee');
		const res = await call('/api/users', { cookie: admin, json: { email, name: 'Nell Invitee', role: 'reviewer' } });
		expect(res.status).toBe(201);
		const body = await res.json();
		expect(body.user).toMatchObject({ email, role: 'reviewer', hasPassword: false });
		expect(body.user).not.toHaveProperty('passwordHash');

		const mail = await waitForMail(email, /invited to Meniscus/);
		const link = linkIn(mail.text);
		expect(await (await call(link)).text()).toMatch(/Choose your password/);
		const pw = 'invited reviewer passphrase';
		expect((await call(link, { form: { password: pw, confirm: pw } })).status).toBe(200);
		expect((await call('/login', { form: { email, password: pw } })).status).toBe(303);
	});

	it('refuses a duplicate address and bad fields, creating nothing', async () => {
		const admin = await signIn('admin@example.org');
		const bad = [
			{ email: 'conservator@example.org', name: 'Again', role: 'curator' },
			{ email: 'not-an-address', name: 'X', role: 'curator' },
			{ email: uniqueEmail('x'), name: 'X', role: 'owner' },
			{ email: uniqueEmail('x'), name: 'X'.repeat(121), role: 'curator' },
			{ email: uniqueEmail('x'), name: 'X', role: 'curator', disabled: false },
		];
		const statuses = [];
		for (const json of bad) statuses.push((await call('/api/users', { cookie: admin, json })).status);
		expect(statuses).toEqual([409, 400, 400, 400, 400]);
		// Counted by address, since other test files create users at the same time.
		const emails = bad.map((b) => b.email);
		expect(await User.count({ where: { email: emails } })).toBe(1); // the demo conservator only
		expect((await User.findOne({ where: { email: 'conservator@example.org' } }))?.name).toBe('Ines Marlowe-Adebayo');
	});
});
