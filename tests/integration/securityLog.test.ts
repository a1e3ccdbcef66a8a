import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Op, QueryTypes } from 'sequelize';
import { call, sessionCookie, useTestDatabase } from '../helpers/server.ts';
import { makeUser, signedInUser } from '../helpers/users.ts';
import { deviceCookieOf, signInFrom } from '../helpers/signInFrom.ts';
import { gradedCheck, newSpecimen, submittedCheck } from '../helpers/checks.ts';
import { db } from '../../src/lib/server/db.ts';
import { audit } from '../../src/lib/server/audit.ts';
import { LoginThrottle } from '../../src/lib/server/models/index.ts';
import { issueToken } from '../../src/lib/server/auth/tokens.ts';
import type { SecurityEvent, SecurityPage } from '../../src/lib/audit/security.ts';

/**
 * TESTPLAN A10, security logs (ASVS 5.0 16.2.1 metadata, 16.2.2 UTC times, 16.2.5 no secrets, 16.3.1
 * authentication events, 16.3.2 authorisation failures, 16.4.1 no log injection, 16.4.2 logs
 * protected): the events of A1–A9 are replayed from addresses of their own, then read back through the
 * administrators' security log and its JSON Lines download.
 */
const from = '127.0.0.7';
let since: Date;
let admin: { id: string; cookie: string };
const secrets: string[] = [];

beforeAll(async () => {
	useTestDatabase();
	db();
	since = new Date();
	admin = await signedInUser('admin', 'seclog');
});

afterAll(async () => {
	await LoginThrottle.destroy({ where: { key: { [Op.like]: '%seclog%' } } });
	await LoginThrottle.destroy({ where: { key: `address:${from}` } });
});

async function readLog(query = ''): Promise<SecurityEvent[]> {
	const res = await call(`/api/security-events?since=${encodeURIComponent(since.toISOString())}&limit=500${query}`, { cookie: admin.cookie });
	expect(res.status).toBe(200);
	return ((await res.json()) as SecurityPage).events;
}

describe('the security log (TESTPLAN A10)', () => {
	it('records every replayed sign-in, refusal and account change with its time in UTC, its actor and its address', async () => {
		const { user, password } = await makeUser('conservator', { tag: 'seclog' });
		secrets.push(password);
		// A7: a wrong password, then the right one (A5), then signing out (A6).
		const wrong = 'not the right passphrase at all';
		secrets.push(wrong);
		expect((await signInFrom(user.email, wrong, { from })).status).toBe(401);
		const ok = await signInFrom(user.email, password, { from });
		expect(ok.status).toBe(303);
		const session = `meniscus_session=${ok.cookies.meniscus_session}`;
		secrets.push(ok.cookies.meniscus_session!, deviceCookieOf(ok).split('=')[1]!);
		// A1: a conservator asks for the user list, an administrator's route.
		expect((await call('/api/users', { cookie: session })).status).toBe(403);
		// Object level: a check in review cannot be edited by its examiner.
		const specimen = await newSpecimen(session, 'SEC');
		const inReview = await submittedCheck(session, specimen.id);
		expect((await call(`/api/checks/${inReview.id}`, { cookie: session, method: 'PUT', json: { version: inReview.version, check: gradedCheck('sneaky') } })).status).toBe(403);
		// A8: a change sent from another site.
		expect((await call('/api/specimens', { cookie: session, json: {}, origin: 'https://elsewhere.example' })).status).toBe(403);
		// A4: an administrator changes the role.
		expect((await call(`/api/users/${user.id}`, { cookie: admin.cookie, method: 'PATCH', json: { role: 'reviewer' } })).status).toBe(200);
		const out = await call('/logout', { cookie: session, method: 'POST' });
		expect([302, 303]).toContain(out.status);

		const events = await readLog();
		const find = (action: string, pred: (e: SecurityEvent) => boolean = () => true) => events.find((e) => e.action === action && pred(e));
		const byUser = (e: SecurityEvent) => e.actor?.id === user.id || e.entityId === user.id;
		for (const e of events) {
			expect(e.occurredAt).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z$/);
			expect(Math.abs(new Date(e.occurredAt).getTime() - Date.now())).toBeLessThan(10 * 60_000);
		}
		expect(find('sign-in.failed', (e) => e.entityId === user.id)).toMatchObject({ kind: 'authentication', actor: null, subject: { id: user.id }, clientAddress: expect.stringContaining(from), detail: { after: { email: user.email, why: 'password' } } });
		expect(find('sign-in', byUser)).toMatchObject({ actor: { email: user.email }, clientAddress: expect.stringContaining(from) });
		expect(find('access.refused', (e) => byUser(e) && e.entityId === '/api/users')).toMatchObject({ kind: 'access', detail: { after: { method: 'GET', reason: 'role' } } });
		expect(find('access.refused', (e) => byUser(e) && e.entityId === '/api/checks/[id]')).toMatchObject({ detail: { after: { method: 'PUT', reason: 'record-rule' } } });
		expect(find('request.cross-site-refused', (e) => e.entityId === '/api/specimens')).toMatchObject({ detail: { after: { origin: 'https://elsewhere.example' } } });
		expect(find('user.update', (e) => e.entityId === user.id)).toMatchObject({ kind: 'accounts', actor: { id: admin.id }, subject: { email: user.email }, detail: { after: { role: 'reviewer' } } });
		expect(find('sign-out', byUser)).toBeTruthy();
		// Only security events: ordinary record changes stay in the audit trail, not here.
		expect(events.some((e) => e.action.startsWith('check.') || e.action.startsWith('specimen.'))).toBe(false);
		// The kinds filter and the address filter.
		expect((await readLog('&kind=access')).every((e) => e.kind === 'access')).toBe(true);
		const fromThere = await readLog(`&address=${from}`);
		expect(fromThere.length).toBeGreaterThanOrEqual(2);
		expect(fromThere.every((e) => e.clientAddress?.includes(from) && e.clientAddress.startsWith(from))).toBe(true);
	});

	it('never holds a password, session id, device token or link token (16.2.5)', async () => {
		const { user } = await makeUser('reviewer', { tag: 'seclog' });
		const token = await issueToken(user.id, 'reset', 60_000);
		secrets.push(token);
		const fresh = 'another fresh passphrase for spirit jars';
		secrets.push(fresh);
		const set = await call(`/reset/${token}`, { form: { password: fresh, confirm: fresh } });
		expect(set.status).toBe(200);
		const signedIn = await call('/login', { form: { email: user.email, password: fresh } });
		secrets.push(sessionCookie(signedIn)!.split('=')[1]!);
		expect(secrets.length).toBeGreaterThanOrEqual(7);
		const json = await (await call(`/api/security-events?since=${encodeURIComponent(since.toISOString())}&limit=500`, { cookie: admin.cookie })).text();
		const lines = await (await call(`/api/security-events?since=${encodeURIComponent(since.toISOString())}&limit=500&format=jsonl`, { cookie: admin.cookie })).text();
		// Every audit row written meanwhile, whatever its kind, as the database holds it.
		const rows = await db().query<{ t: string }>(`SELECT row_to_json(a)::text AS t FROM audit_events a WHERE occurred_at >= :since`, { replacements: { since }, type: QueryTypes.SELECT });
		expect(rows.length).toBeGreaterThan(5);
		for (const s of secrets) {
			expect(json).not.toContain(s);
			expect(lines).not.toContain(s);
			for (const r of rows) expect(r.t).not.toContain(s);
		}
		expect(json).toContain('password.set-by-reset');
	});

	it('writes one JSON line per event, line breaks in values escaped, times in UTC (16.4.1)', async () => {
		// A value holding CR/LF and a forged entry, as if a future field let one through.
		await audit({ action: 'sign-in.failed', entityType: 'user', entityId: null, after: { email: 'x@example.org\r\n{"action":"sign-in","forged":true}' }, clientAddress: from });
		const res = await call(`/api/security-events?since=${encodeURIComponent(since.toISOString())}&limit=500&format=jsonl`, { cookie: admin.cookie });
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toMatch(/^application\/x-ndjson/);
		expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="meniscus-security-[\d-]+\.jsonl"$/);
		const text = await res.text();
		const lines = text.trimEnd().split('\n');
		const events = lines.map((l) => JSON.parse(l) as SecurityEvent);
		expect(events.length).toBe((await readLog()).length);
		expect(events.every((e) => /Z$/.test(e.occurredAt))).toBe(true);
		expect(events.filter((e) => (e as unknown as { forged?: boolean }).forged)).toHaveLength(0);
		expect(text).toContain('x@example.org\\r\\n{\\"action\\"');
	});

	it('pages from newest to oldest, and refuses bad filters with a clear 400 and other roles with a 403', async () => {
		const first = (await (await call(`/api/security-events?since=${encodeURIComponent(since.toISOString())}&limit=2`, { cookie: admin.cookie })).json()) as SecurityPage;
		expect(first.events).toHaveLength(2);
		expect(first.events[0]!.id).toBeGreaterThan(first.events[1]!.id);
		const second = (await (await call(`/api/security-events?since=${encodeURIComponent(since.toISOString())}&limit=2&before=${first.next}`, { cookie: admin.cookie })).json()) as SecurityPage;
		expect(second.events[0]!.id).toBeLessThan(first.events[1]!.id);
		for (const bad of ['address=%25', "address=1'--", 'kind=secrets', 'limit=5000', 'since=yesterday', 'format=xml', 'role=admin']) {
			const res = await call(`/api/security-events?${bad}`, { cookie: admin.cookie });
			expect(res.status, bad).toBe(400);
			expect((await res.json()).error).toBe('Some filters are not acceptable.');
		}
		const curator = await signedInUser('curator', 'seclog');
		expect((await call('/api/security-events', { cookie: curator.cookie })).status).toBe(403);
	});

	it('keeps the audit trail append-only in the database (16.4.2)', async () => {
		for (const sql of ['UPDATE audit_events SET action = action WHERE id = (SELECT max(id) FROM audit_events)', 'DELETE FROM audit_events WHERE id = (SELECT max(id) FROM audit_events)', 'TRUNCATE audit_events']) {
			await expect(db().query(sql), sql).rejects.toThrow(/append-only/);
		}
	});
});
