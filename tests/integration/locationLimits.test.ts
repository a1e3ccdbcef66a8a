import { beforeAll, describe, expect, it } from 'vitest';
import { call, useTestDatabase } from '../helpers/server.ts';
import { cookieFor, makeUser } from '../helpers/users.ts';
import { AuditEvent, StorageLocation } from '../../src/lib/server/models/index.ts';

/**
 * The administrator sets a store's flammable limit, near share and temperature range: checked as a
 * whole, refused with 400 and no change when wrong, audited when made. On a location of the test's
 * own, so the demo stores the overview tests read stay as seeded.
 */
let admin = '';
let adminId = '';
let curator = '';
let id = '';

beforeAll(async () => {
	useTestDatabase();
	const a = await makeUser('admin', { tag: 'lim' });
	adminId = a.user.id;
	admin = await cookieFor(a.user.id);
	curator = await cookieFor((await makeUser('curator', { tag: 'lim' })).user.id);
	const res = await call('/api/locations', { cookie: admin, json: { code: `LIM-${process.pid}`, name: 'Limits test bay' } });
	expect(res.status).toBe(201);
	const { location } = await res.json();
	expect(location).toMatchObject({ flammableLimitL: null, nearLimitPercent: 80, tempMinC: null, tempMaxC: null });
	id = location.id;
});

const patch = (body: unknown, cookie = admin) => call(`/api/locations/${id}`, { method: 'PATCH', cookie, json: body });
const stored = async () => {
	const l = (await StorageLocation.findByPk(id))!;
	return { flammableLimitL: l.flammableLimitL, nearLimitPercent: l.nearLimitPercent, tempMinC: l.tempMinC, tempMaxC: l.tempMaxC };
};
const events = () => AuditEvent.count({ where: { entityType: 'location', entityId: id, action: 'location.limits' } });

describe('a store’s limits', () => {
	it('are set by the administrator, kept to 0.1, shown by GET /api/locations and audited with before and after', async () => {
		const res = await patch({ flammableLimitL: 45.26, nearLimitPercent: 75, tempMinC: 14, tempMaxC: 21.5 });
		expect(res.status).toBe(200);
		expect((await res.json()).location).toMatchObject({ flammableLimitL: 45.3, nearLimitPercent: 75, tempMinC: 14, tempMaxC: 21.5 });
		expect(await stored()).toEqual({ flammableLimitL: 45.3, nearLimitPercent: 75, tempMinC: 14, tempMaxC: 21.5 });
		const list = await (await call('/api/locations', { cookie: curator })).json();
		expect(list.locations.find((l: { id: string }) => l.id === id)).toMatchObject({ flammableLimitL: 45.3, tempMaxC: 21.5 });
		const e = (await AuditEvent.findOne({ where: { entityType: 'location', entityId: id, action: 'location.limits' }, order: [['id', 'DESC']] }))!;
		expect(e.actorId).toBe(adminId);
		expect(e.before).toEqual({ flammableLimitL: null, nearLimitPercent: 80, tempMinC: null, tempMaxC: null });
		expect(e.after).toEqual({ flammableLimitL: 45.3, nearLimitPercent: 75, tempMinC: 14, tempMaxC: 21.5 });
	});

	it('change only what a request names, and clear a limit with null', async () => {
		expect((await patch({ tempMaxC: 23 })).status).toBe(200);
		expect(await stored()).toMatchObject({ flammableLimitL: 45.3, tempMinC: 14, tempMaxC: 23 });
		expect((await patch({ flammableLimitL: null })).status).toBe(200);
		expect((await stored()).flammableLimitL).toBeNull();
		expect((await patch({ flammableLimitL: 45.3 })).status).toBe(200);
	});

	it('refuse bad values with 400, naming the field, and change nothing', async () => {
		const before = await stored();
		const audited = await events();
		const bad: [unknown, string][] = [
			[{ flammableLimitL: -5 }, 'flammableLimitL'],
			[{ flammableLimitL: 0 }, 'flammableLimitL'],
			[{ flammableLimitL: 'lots' }, 'flammableLimitL'],
			[{ nearLimitPercent: 0 }, 'nearLimitPercent'],
			[{ nearLimitPercent: 120 }, 'nearLimitPercent'],
			[{ tempMaxC: 55 }, 'tempMaxC'],
			[{ tempMinC: -30 }, 'tempMinC'],
			[{ tempMinC: 25 }, 'tempMinC'], // above the warmest (23)
			[{ tempMinC: 10, tempMaxC: 5 }, 'tempMinC'],
		];
		for (const [body, field] of bad) {
			const res = await patch(body);
			expect(res.status, JSON.stringify(body)).toBe(400);
			expect((await res.json()).fields.map((f: { path: string }) => f.path), JSON.stringify(body)).toContain(field);
		}
		expect((await patch({ flammableLimitL: 10, owner: 'me' })).status).toBe(400);
		expect((await call(`/api/locations/${id}`, { method: 'PATCH', cookie: admin, headers: { 'content-type': 'text/plain' } })).status).toBe(415);
		expect(await stored()).toEqual(before);
		expect(await events()).toBe(audited);
	});

	it('are the administrator’s alone, and a location that does not exist is 404', async () => {
		expect((await patch({ tempMaxC: 30 }, curator)).status).toBe(403);
		expect((await call(`/api/locations/${id}`, { method: 'PATCH', json: { tempMaxC: 30 } })).status).toBe(401);
		expect((await call('/api/locations/00000000-0000-4000-8000-000000000000', { method: 'PATCH', cookie: admin, json: { tempMaxC: 20 } })).status).toBe(404);
		expect((await stored()).tempMaxC).toBe(23);
	});
});
