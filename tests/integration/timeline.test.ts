import { QueryTypes } from 'sequelize';
import { beforeAll, describe, expect, it } from 'vitest';
import { call, useTestDatabase } from '../helpers/server.ts';
import { cookieFor, makeUser } from '../helpers/users.ts';
import { db } from '../../src/lib/server/db.ts';
import { TimelineSchema } from '../../src/lib/history/schema.ts';

/** GET /api/specimens/[id]/timeline: a specimen's checks, readings and trends, for every signed-in role. */
const cookies: Record<string, string> = {};
let squid = '';

beforeAll(async () => {
	useTestDatabase();
	db();
	for (const role of ['conservator', 'reviewer', 'curator', 'admin'] as const) cookies[role] = await cookieFor((await makeUser(role, { tag: 'tml' })).user.id);
	const [row] = await db().query<{ id: string }>(`SELECT id FROM specimens WHERE object_number = 'STC.1936.078'`, { type: QueryTypes.SELECT });
	squid = row!.id;
});

describe('a specimen’s history', () => {
	it('is read by every signed-in role; the signed-out are asked to sign in; an unknown jar is 404', async () => {
		for (const role of Object.keys(cookies)) expect((await call(`/api/specimens/${squid}/timeline`, { cookie: cookies[role] })).status, role).toBe(200);
		expect((await call(`/api/specimens/${squid}/timeline`)).status).toBe(401);
		expect((await call('/api/specimens/00000000-0000-4000-8000-000000000000/timeline', { cookie: cookies.curator })).status).toBe(404);
		expect((await call('/api/specimens/not-an-id/timeline', { cookie: cookies.curator })).status).toBe(404);
	});

	it('gives every check oldest first, with the level trend of the approved ones and its forecast', async () => {
		const t = TimelineSchema.parse(await (await call(`/api/specimens/${squid}/timeline`, { cookie: cookies.curator })).json());
		const checks = await db().query<{ id: string; state: string }>(
			`SELECT id, state FROM condition_checks WHERE specimen_id = :id ORDER BY checked_on, created_at`,
			{ type: QueryTypes.SELECT, replacements: { id: squid } },
		);
		expect(t.checks.map((c) => c.id)).toEqual(checks.map((c) => c.id));
		expect(t.specimen).toMatchObject({ objectNumber: 'STC.1936.078', innerHeightMm: 280 });
		expect(t.specimen.specimenTopMm).not.toBeNull();
		// The returned check left the level out: three approved levels, all fitted.
		expect(t.series.level.points.filter((p) => p.used)).toHaveLength(3);
		expect(t.series.level.trend.kind).toBe('trend');
		if (t.series.level.trend.kind === 'trend') expect(t.series.level.trend.perYear).toBeLessThan(-5);
		expect(t.series.level.forecast?.kind).toBe('date');
		expect(t.series.level.forecast?.message).toMatch(/^At this rate the fluid reaches the top of the specimen in about \d+ months/);
		// Strength is drawn for the open check too, but only the approved ones are fitted.
		expect(t.series.strength.points.map((p) => p.used)).toEqual([true, true, true, false]);
		expect(t.series.strength.threshold).toBe(65);
		// Yellowness comes from the checks' front photographs (the test set-up draws the latest check's
		// only): a spirit yellowed by years of extractives reads well above a white's 0 (ASTM E313).
		const measured = t.checks.filter((c) => c.yellowness !== null);
		expect(measured.map((c) => c.id)).toEqual([t.checks.at(-1)!.id]);
		expect(measured[0]!.yellowness).toBeGreaterThan(10);
		expect(measured[0]!.yellowness).toBeLessThan(150);
		expect(t.series.yellowness.points.map((p) => p.value)).toEqual([measured[0]!.yellowness]);
	});

	it('says so when a jar has too few readings for a trend', async () => {
		const [row] = await db().query<{ id: string }>(`SELECT id FROM specimens WHERE object_number = 'STC.1902.017'`, { type: QueryTypes.SELECT });
		const t = TimelineSchema.parse(await (await call(`/api/specimens/${row!.id}/timeline`, { cookie: cookies.reviewer })).json());
		expect(t.series.level.trend.kind).toBe('too-few-points');
		expect(t.series.level.forecast?.message).toMatch(/^No forecast: at least three dated readings are needed/);
	});
});
