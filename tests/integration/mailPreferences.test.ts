import { beforeAll, describe, expect, it } from 'vitest';
import { call, useTestDatabase } from '../helpers/server.ts';
import { signedInUser } from '../helpers/users.ts';
import { db } from '../../src/lib/server/db.ts';
import { AuditEvent } from '../../src/lib/server/models/index.ts';

/** GET/PATCH /api/me/mail-preferences: one's own choices only, checked with zod, audited. */
const all = (on: boolean) => ({ checkSubmitted: on, riskSubmitted: on, checkReturned: on, checkApproved: on, riskReviewed: on, dueDigest: on });
const get = (cookie?: string) => call('/api/me/mail-preferences', { cookie });
const patch = (json: unknown, cookie?: string) => call('/api/me/mail-preferences', { method: 'PATCH', cookie, json });
let a = { id: '', cookie: '' };
let b = { id: '', cookie: '' };

beforeAll(async () => {
	useTestDatabase();
	db();
	a = await signedInUser('conservator', 'prefs-a');
	b = await signedInUser('reviewer', 'prefs-b');
});

describe('mail preferences', () => {
	it('must 401 when signed out, for reading and for changing', async () => {
		expect((await get()).status).toBe(401);
		expect((await patch({ dueDigest: false })).status).toBe(401);
	});

	it('starts with every kind on, and changes only the kinds named; the change is audited', async () => {
		expect(await (await get(a.cookie)).json()).toEqual({ preferences: all(true) });
		const res = await patch({ dueDigest: false }, a.cookie);
		expect(res.status).toBe(200);
		expect(await res.json()).toEqual({ preferences: { ...all(true), dueDigest: false } });
		expect(await (await get(a.cookie)).json()).toEqual({ preferences: { ...all(true), dueDigest: false } });
		const event = await AuditEvent.findOne({ where: { action: 'user.mail-preferences', entityId: a.id }, order: [['id', 'DESC']] });
		expect(event).toMatchObject({ actorId: a.id, before: all(true), after: { ...all(true), dueDigest: false } });
		expect((await patch({ dueDigest: true, checkReturned: false }, a.cookie)).status).toBe(200);
		expect((await (await get(a.cookie)).json()).preferences).toEqual({ ...all(true), checkReturned: false });
	});

	it.each([
		['nothing named', {}],
		['a string for a boolean', { checkReturned: 'no' }],
		['an unknown kind', { passwordReset: false }],
		['account mail', { invitations: false }],
		['another user', { userId: '00000000-0000-4000-8000-000000000000', checkApproved: false }],
		['not an object', [true]],
	])('must 400 on %s and change nothing', async (_why, body) => {
		const before = await (await get(a.cookie)).json();
		const res = await patch(body, a.cookie);
		expect(res.status).toBe(400);
		expect((await res.json()).error).toBeTruthy();
		expect(await (await get(a.cookie)).json()).toEqual(before);
	});

	it('must 415 on a body that is not JSON', async () => {
		const res = await call('/api/me/mail-preferences', { method: 'PATCH', cookie: a.cookie, headers: { 'content-type': 'text/plain' } });
		expect(res.status).toBe(415);
	});

	it('keeps each person’s choices their own', async () => {
		expect((await patch({ checkSubmitted: false }, b.cookie)).status).toBe(200);
		expect((await (await get(a.cookie)).json()).preferences.checkSubmitted).toBe(true);
		expect((await (await get(b.cookie)).json()).preferences).toEqual({ ...all(true), checkSubmitted: false });
	});
});
