import { beforeAll, describe, expect, it } from 'vitest';
import { call, useTestDatabase } from '../helpers/server.ts';
import { specimenRecord } from '../helpers/specimens.ts';
import { cookieFor, makeUser } from '../helpers/users.ts';
import { db } from '../../src/lib/server/db.ts';
import { AuditEvent, ConditionCheck, Specimen } from '../../src/lib/server/models/index.ts';
import { realStrengthAt20 } from '../../src/lib/fluid/alcoholometry.ts';

/** Condition checks over HTTP: open, grade, read the fluid, submit, return, resubmit, approve. */
const cookies: Record<string, string> = {};
const ids: Record<string, string> = {};
let specimenId = '';

beforeAll(async () => {
	useTestDatabase();
	db();
	for (const role of ['conservator', 'reviewer', 'curator'] as const) {
		const { user } = await makeUser(role, { tag: 'chk' });
		ids[role] = user.id;
		cookies[role] = await cookieFor(user.id);
	}
	const res = await call('/api/specimens', {
		cookie: cookies.conservator,
		json: specimenRecord(`CK${process.pid}`, { title: 'Check newt', sealType: 'pitch', hazards: [{ flag: 'coal-tar-pitch', note: '' }] }),
	});
	specimenId = (await res.json()).specimen.id;
});

const empty = { grade: null, terms: [], note: '' };
const body = (over: Record<string, unknown> = {}) => ({
	checkedOn: '2026-11-20',
	reason: 'routine-survey',
	parts: {
		container: { grade: 'good', terms: [], note: '' },
		lid: empty,
		seal: { grade: 'poor', terms: ['cracked', 'leaking'], note: 'Pitch crazed at the back.' },
		fluid: { grade: 'fair', terms: ['low level / evaporation'], note: '' },
		specimen: { grade: 'good', terms: [], note: '' },
		mount: empty,
		label: empty,
	},
	priority: 'high',
	notes: '',
	fluid: { readingPercentVol: 70, tempC: 25, glass: 'soda-lime', formaldehyde: 'not-tested', pH: null, levelMm: 142, method: 'meter in a 250 mL cylinder' },
	...over,
});

async function open() {
	const res = await call(`/api/specimens/${specimenId}/checks`, { cookie: cookies.conservator, json: {} });
	expect(res.status).toBe(201);
	return (await res.json()).check;
}
const put = (id: string, version: number, check: unknown, cookie = cookies.conservator) => call(`/api/checks/${id}`, { cookie, method: 'PUT', json: { version, check } });
const submit = (id: string, version: number, cookie = cookies.conservator) => call(`/api/checks/${id}/submit`, { cookie, json: { version } });
const review = (id: string, decision: string, comment = '', cookie = cookies.reviewer) => call(`/api/checks/${id}/review`, { cookie, json: { decision, comment } });

describe('a condition check from draft to approval', () => {
	it('computes the overall grade, the real strength and the next check due when saved', async () => {
		const c = await open();
		expect(c).toMatchObject({ state: 'draft', overallGrade: null, version: 0 });
		const saved = await (await put(c.id, 0, body())).json();
		expect(saved.check.overallGrade).toBe('poor');
		expect(saved.check.fluid.realPercentVol).toBeCloseTo(realStrengthAt20(70, 25), 9);
		expect(saved.check.nextCheckDue).toBe('2027-05-20');
	});

	it('is returned with a comment, edited back to a draft, resubmitted and approved; the specimen then shows the condition', async () => {
		const c = await open();
		let v = (await (await put(c.id, 0, body())).json()).check.version;
		let r = await (await submit(c.id, v)).json();
		expect(r.check.state).toBe('in-review');
		// Nothing can change while it waits.
		expect((await put(c.id, r.check.version, body({ notes: 'sneaky' }))).status).toBe(403);
		expect((await review(c.id, 'return', '')).status).toBe(400);
		r = await (await review(c.id, 'return', 'Record the fluid level against the inner base mark, please.')).json();
		expect(r.check).toMatchObject({ state: 'returned', reviewComment: expect.stringMatching(/fluid level/) });
		r = await (await put(c.id, r.check.version, body({ notes: 'Level re-measured from the inner base.' }))).json();
		expect(r.check.state).toBe('draft');
		r = await (await submit(c.id, r.check.version)).json();
		r = await (await review(c.id, 'approve')).json();
		expect(r.check).toMatchObject({ state: 'approved', reviewer: { id: ids.reviewer } });
		const s = await Specimen.findByPk(specimenId);
		expect(s).toMatchObject({ currentGrade: 'poor', currentPriority: 'high', lastCheckedOn: '2026-11-20', nextCheckDue: '2027-05-20' });
		const actions = (await AuditEvent.findAll({ where: { entityType: 'check', entityId: c.id }, order: [['id', 'ASC']] })).map((e) => e.action);
		expect(actions).toEqual(['check.open', 'check.save', 'check.submit', 'check.return', 'check.save', 'check.submit', 'check.approve']);
	});

	it('never changes an approved check, even bypassing the application', async () => {
		const c = await open();
		const v = (await (await put(c.id, 0, body())).json()).check.version;
		const s = await (await submit(c.id, v)).json();
		await review(c.id, 'approve');
		expect((await put(c.id, s.check.version + 1, body())).status).toBe(403);
		expect((await review(c.id, 'return', 'changed my mind')).status).toBe(403);
		await expect(ConditionCheck.update({ notes: 'tampered' }, { where: { id: c.id } })).rejects.toThrow(/approved condition check cannot be changed/);
		// A correction is a new check that points to the approved one.
		const fix = await call(`/api/specimens/${specimenId}/checks`, { cookie: cookies.conservator, json: { corrects: c.id } });
		expect(fix.status).toBe(201);
		expect((await fix.json()).check).toMatchObject({ state: 'draft', correctsCheckId: c.id, overallGrade: 'poor' });
	});
});

describe('refusals', () => {
	it('refuses a stale save with 409 and the check as it is now', async () => {
		const c = await open();
		await put(c.id, 0, body());
		const stale = await put(c.id, 0, body({ notes: 'late' }));
		expect(stale.status).toBe(409);
		expect((await stale.json()).current.version).toBe(1);
	});
	it('refuses fluid readings outside the OIML range, half readings, and an override without a reason', async () => {
		const c = await open();
		const cases: [unknown, RegExp][] = [
			[body({ fluid: { ...body().fluid, tempC: 52 } }), /Fluid reading: The temperature must be between -20 and \+40/],
			[body({ fluid: { ...body().fluid, tempC: null } }), /both the meter reading and the temperature/],
			[body({ overallOverride: { grade: 'good', reason: 'nah' } }), /say why/],
			[body({ fluid: { ...body().fluid, pH: 15 } }), /pH is between 0 and 14/],
			[body({ reason: 'because' }), /Invalid option|reason/i],
		];
		for (const [json, msg] of cases) {
			const res = await put(c.id, 0, json);
			expect(res.status).toBe(400);
			const b = await res.json();
			expect([b.error, ...b.fields.map((f: { message: string }) => f.message)].join(' ')).toMatch(msg);
		}
		expect((await ConditionCheck.findByPk(c.id))!.version).toBe(0);
	});
	it('refuses submitting an ungraded check, and lets only the right roles act', async () => {
		const c = await open();
		expect((await submit(c.id, 0)).status).toBe(400);
		expect((await put(c.id, 0, body(), cookies.reviewer)).status).toBe(403);
		expect((await put(c.id, 0, body(), cookies.curator)).status).toBe(403);
		const v = (await (await put(c.id, 0, body())).json()).check.version;
		await submit(c.id, v);
		expect((await review(c.id, 'approve', '', cookies.conservator)).status).toBe(403);
		expect((await review(c.id, 'approve', '', cookies.curator)).status).toBe(403);
	});
	it('shows the review queue to reviewers, oldest first, and my open checks to me', async () => {
		const queue = await (await call('/api/checks?view=queue', { cookie: cookies.reviewer })).json();
		const times = queue.checks.map((c: { submittedAt: string }) => c.submittedAt);
		expect([...times].sort()).toEqual(times);
		const mine = await (await call('/api/checks?view=mine', { cookie: cookies.conservator })).json();
		expect(mine.checks.every((c: { examiner: { id: string }; state: string }) => c.examiner.id === ids.conservator && ['draft', 'returned'].includes(c.state))).toBe(true);
		expect((await call('/api/checks?view=queue', { cookie: cookies.curator })).status).toBe(403);
	});
});

describe('vocabulary and intervals', () => {
	it('lets an administrator add a damage term and change the intervals; others may only read', async () => {
		const admin = await cookieFor((await makeUser('admin', { tag: 'voc' })).user.id);
		const term = `bloom ${process.pid}`;
		const add = await call('/api/vocabulary/terms', { cookie: admin, json: { part: 'fluid', term } });
		expect(add.status).toBe(201);
		expect((await add.json()).terms.fluid).toContain(term);
		expect((await call('/api/vocabulary/terms', { cookie: admin, json: { part: 'fluid', term } })).status).toBe(409);
		expect((await call('/api/vocabulary/terms', { cookie: cookies.conservator, json: { part: 'fluid', term: 'x2' } })).status).toBe(403);
		const code = `T-${process.pid}`;
		const loc = await call('/api/locations', { cookie: admin, json: { code, name: 'Test bay' } });
		expect(loc.status).toBe(201);
		expect((await call('/api/locations', { cookie: admin, json: { code, name: 'Again' } })).status).toBe(409);
		expect((await call('/api/locations', { cookie: admin, json: { code: '<b>', name: 'x' } })).status).toBe(400);
		expect((await call('/api/locations', { cookie: cookies.conservator, json: { code: 'X1', name: 'x' } })).status).toBe(403);
		const iv = await call('/api/settings/intervals', { cookie: admin, method: 'PUT', json: { good: 24, fair: 12, poor: 6, unacceptable: 1 } });
		expect(iv.status).toBe(200);
		expect((await call('/api/settings/intervals', { cookie: admin, method: 'PUT', json: { good: 0, fair: 12, poor: 6, unacceptable: 1 } })).status).toBe(400);
	});
});
