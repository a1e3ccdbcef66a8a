import { QueryTypes } from 'sequelize';
import { beforeAll, describe, expect, it } from 'vitest';
import { call, useTestDatabase } from '../helpers/server.ts';
import { cookieFor, makeUser } from '../helpers/users.ts';
import { db } from '../../src/lib/server/db.ts';
import { OverviewSchema, type Overview } from '../../src/lib/overview/schema.ts';
import { registerHref } from '../../src/lib/overview/links.ts';
import { TimelineSchema } from '../../src/lib/history/schema.ts';
import { jarFluidMl } from '../../src/lib/overview/inventory.ts';
import { airspaceVerdict } from '../../src/lib/overview/airspaceRisk.ts';
import { GRADES, PRIORITIES } from '../../src/lib/check/vocabulary.ts';
import type { JarShape } from '../../src/lib/fluid/jar.ts';

/**
 * GET /api/overview on the demo collection: who may read it, its filters, and its figures held to a
 * direct SQL count and to the register view each one links to. Other test files add their own jars
 * (without a department, or in the zoology series), so the exact counts use the demo's comparative
 * anatomy collection, and the store totals a store no other test uses (GAL-2).
 */
const COLLECTION = 'Comparative anatomy';
const cookies: Record<string, string> = {};
const sql = <T extends object>(q: string, replacements: Record<string, unknown> = {}) => db().query<T>(q, { type: QueryTypes.SELECT, replacements });
let locations: Map<string, string>;

beforeAll(async () => {
	useTestDatabase();
	db();
	for (const role of ['conservator', 'reviewer', 'curator', 'admin'] as const) cookies[role] = await cookieFor((await makeUser(role, { tag: 'ovw' })).user.id);
	locations = new Map((await sql<{ id: string; code: string }>('SELECT id, code FROM storage_locations')).map((l) => [l.code, l.id]));
});

async function overview(query = '', cookie = cookies.curator): Promise<Overview> {
	const res = await call(`/api/overview${query}`, { cookie });
	expect(res.status).toBe(200);
	return OverviewSchema.parse(await res.json());
}

async function registerTotal(href: string): Promise<number> {
	const res = await call(`/api/specimens?${href.split('?')[1] ?? ''}`, { cookie: cookies.curator });
	expect(res.status).toBe(200);
	return (await res.json()).total;
}

describe('who reads the collection overview', () => {
	it('answers curators, reviewers and conservators, refuses administrators, and asks the signed-out to sign in', async () => {
		for (const role of ['curator', 'reviewer', 'conservator']) expect((await call('/api/overview', { cookie: cookies[role] })).status).toBe(200);
		expect((await call('/api/overview', { cookie: cookies.admin })).status).toBe(403);
		expect((await call('/api/overview')).status).toBe(401);
	});
	it('refuses a location that is not an id and a parameter it does not know, with 400', async () => {
		for (const q of ['?location=SPR-A1', "?location=1'%20OR%201=1", '?colour=red']) {
			const res = await call(`/api/overview${q}`, { cookie: cookies.curator });
			expect(res.status, q).toBe(400);
		}
	});
});

describe('the counts of one collection', () => {
	let o: Overview;
	beforeAll(async () => {
		o = await overview(`?collection=${encodeURIComponent(COLLECTION)}`);
	});

	it('agree with a direct count in SQL', async () => {
		const [t] = await sql<Record<string, string>>(
			`SELECT count(*) AS specimens, count(*) FILTER (WHERE next_check_due < :day) AS overdue,
			        count(*) FILTER (WHERE id IN (SELECT specimen_id FROM condition_checks WHERE state = 'in-review')) AS in_review
			 FROM specimens WHERE deleted_at IS NULL AND department = :c`,
			{ c: COLLECTION, day: o.asOf },
		);
		expect(o.specimens).toBe(Number(t!.specimens));
		expect(o.overdue).toBe(Number(t!.overdue));
		expect(o.inReview).toBe(Number(t!.in_review));
		const grades = await sql<{ g: string | null; n: string }>(`SELECT current_grade AS g, count(*) AS n FROM specimens WHERE deleted_at IS NULL AND department = :c GROUP BY 1`, { c: COLLECTION });
		for (const g of [...GRADES, 'not-checked'] as const) {
			const want = Number(grades.find((r) => r.g === (g === 'not-checked' ? null : g))?.n ?? 0);
			expect(o.byGrade.find((r) => r.grade === g)?.count, g).toBe(want);
		}
		const priorities = await sql<{ p: string | null; n: string }>(`SELECT current_priority AS p, count(*) AS n FROM specimens WHERE deleted_at IS NULL AND department = :c GROUP BY 1`, { c: COLLECTION });
		for (const p of [...PRIORITIES, 'not-set'] as const) {
			expect(o.byPriority.find((r) => r.priority === p)?.count, p).toBe(Number(priorities.find((r) => r.p === (p === 'not-set' ? null : p))?.n ?? 0));
		}
		const hazards = await sql<{ f: string; n: string }>(
			`SELECT h->>'flag' AS f, count(*) AS n FROM specimens, jsonb_array_elements(hazards) h WHERE deleted_at IS NULL AND department = :c GROUP BY 1`,
			{ c: COLLECTION },
		);
		expect(Object.fromEntries(o.byHazard.map((h) => [h.flag, h.count]))).toEqual(Object.fromEntries(hazards.map((h) => [h.f, Number(h.n)])));
		// The demo gives this collection jars of several conditions and hazards, so the comparison means something.
		expect(o.specimens).toBeGreaterThanOrEqual(8);
		expect(o.byHazard.length).toBeGreaterThanOrEqual(2);
	});

	it('each open the register view that lists exactly those jars', async () => {
		const f = { collection: COLLECTION };
		expect(await registerTotal(registerHref(f))).toBe(o.specimens);
		expect(await registerTotal(registerHref(f, { due: 'overdue' }))).toBe(o.overdue);
		expect(await registerTotal(registerHref(f, { check: 'in-review' }))).toBe(o.inReview);
		for (const g of o.byGrade) expect(await registerTotal(registerHref(f, { grade: g.grade })), g.grade).toBe(g.count);
		for (const p of o.byPriority) expect(await registerTotal(registerHref(f, { priority: p.priority })), p.priority).toBe(p.count);
		for (const h of o.byHazard) expect(await registerTotal(registerHref(f, { hazard: h.flag })), h.flag).toBe(h.count);
	});

	it('list the collection and the locations for the filters', () => {
		expect(o.collections).toEqual(expect.arrayContaining(['Comparative anatomy', 'Pathology teaching series', 'Zoology teaching series']));
		expect(o.locations.map((l) => l.code)).toEqual(expect.arrayContaining(['SPR-A1', 'GAL-2', 'QRT-1']));
		expect(o.filters).toEqual({ collection: COLLECTION, location: null });
	});
});

describe('the location filter', () => {
	it('narrows every part of the overview to the jars in that store', async () => {
		const id = locations.get('SPR-A2')!;
		const o = await overview(`?location=${id}`);
		const [t] = await sql<{ n: string }>(`SELECT count(*) AS n FROM specimens WHERE deleted_at IS NULL AND storage_location_id = :id`, { id });
		expect(o.specimens).toBe(Number(t!.n));
		expect(o.inventory.map((r) => r.location.code)).toEqual(['SPR-A2']);
		for (const r of [...o.fluidLoss.byRate, ...o.fluidLoss.byTimeLeft]) expect(r.location).toBe('SPR-A2');
		for (const r of o.airspace.rows) expect(r.location.code).toBe('SPR-A2');
		expect(await registerTotal(registerHref({ location: id }))).toBe(o.specimens);
	});
});

describe('fluid loss', () => {
	it('ranks the failing wax seal of STC.1936.078 first, at the rate its own history shows', async () => {
		const o = await overview();
		const first = o.fluidLoss.byRate[0]!;
		expect(first.objectNumber).toBe('STC.1936.078');
		const timeline = TimelineSchema.parse(await (await call(`/api/specimens/${first.id}/timeline`, { cookie: cookies.curator })).json());
		const level = timeline.series.level;
		expect(level.trend.kind).toBe('trend');
		if (level.trend.kind === 'trend') expect(first.perYearMm).toBeCloseTo(level.trend.perYear, 9);
		expect(first.forecast).toEqual(level.forecast);
		// Sorted: fastest first; nearest to exposure first.
		const rates = o.fluidLoss.byRate.map((r) => r.perYearMm!);
		expect(rates).toEqual([...rates].sort((a, b) => a - b));
		const months = o.fluidLoss.byTimeLeft.map((r) => (r.forecast.kind === 'date' ? r.forecast.monthsFromToday : -Infinity));
		expect(months).toEqual([...months].sort((a, b) => a - b));
		expect(o.fluidLoss.byRate.length).toBeLessThanOrEqual(10);
	});
});

describe('flammable fluid by store', () => {
	it('adds up the spirit in a store from each jar’s size and latest approved level, as a direct query does', async () => {
		const id = locations.get('GAL-2')!;
		const jars = await sql<{ shape: JarShape; w: number; d: number | null; h: number; level: number | null }>(
			`SELECT s.container_shape AS shape, s.inner_width_mm::float8 AS w, s.inner_depth_mm::float8 AS d, s.inner_height_mm::float8 AS h,
			        (SELECT (c.fluid->>'levelMm')::float8 FROM condition_checks c WHERE c.specimen_id = s.id AND c.state = 'approved' AND c.fluid->>'levelMm' IS NOT NULL
			         ORDER BY c.checked_on DESC LIMIT 1) AS level
			 FROM specimens s WHERE s.deleted_at IS NULL AND s.storage_location_id = :id
			   AND (s.preservative_kind IN ('ethanol', 'industrial-spirit', 'propan-2-ol', 'unknown') OR s.hazards @> '[{"flag":"flammable-spirit"}]' OR s.hazards @> '[{"flag":"unknown-fluid"}]')`,
			{ id },
		);
		const want = jars.reduce((a, j) => a + jarFluidMl({ shape: j.shape, widthMm: j.w, depthMm: j.d, heightMm: j.h }, j.level), 0);
		const row = (await overview()).inventory.find((r) => r.location.code === 'GAL-2')!;
		expect(row.jars).toBe(jars.length);
		expect(row.spiritMl + row.presumedMl).toBeCloseTo(want, 6);
		expect(row).toMatchObject({ limitL: 8, nearLimitPercent: 80, status: 'within' });
		expect(row.share).toBeCloseTo(want / 8000, 9);
	});

	it('shows the demo’s spirit store A bay 1 near its limit, and the quarantine shelf with none set', async () => {
		const o = await overview();
		expect(o.inventory.find((r) => r.location.code === 'SPR-A1')?.status).toMatch(/^(near|over)$/);
		expect(o.inventory.find((r) => r.location.code === 'QRT-1')).toMatchObject({ status: 'no-limit', limitL: null });
		// Unknown fluids on the quarantine shelf are counted as presumed flammable, apart from spirit.
		expect(o.inventory.find((r) => r.location.code === 'QRT-1')!.presumedMl).toBeGreaterThan(0);
	});

	it('opens, from a store, the register view of the jars its total counts', async () => {
		const o = await overview();
		for (const code of ['GAL-2', 'QRT-1', 'FRM-1']) {
			const row = o.inventory.find((r) => r.location.code === code)!;
			expect(await registerTotal(registerHref({}, { location: row.location.id, flammable: 'yes' })), code).toBe(row.jars);
		}
	});
});

describe('airspace at risk', () => {
	it('lists the demo jars filled nearly to the lid, with the draw-off airspace() gives', async () => {
		const o = await overview();
		const codes = o.airspace.rows.map((r) => r.objectNumber);
		expect(codes).toEqual(expect.arrayContaining(['STC.1902.017', 'STC.1911.008', 'STC.1923.004']));
		const octopus = o.airspace.rows.find((r) => r.objectNumber === 'STC.1902.017')!;
		const [j] = await sql<{ w: number; d: number; h: number; level: number; temp: number; real: number }>(
			`SELECT s.inner_width_mm::float8 AS w, s.inner_depth_mm::float8 AS d, s.inner_height_mm::float8 AS h,
			        (c.fluid->>'levelMm')::float8 AS level, (c.fluid->>'tempC')::float8 AS temp, (c.fluid->>'realPercentVol')::float8 AS real
			 FROM specimens s JOIN condition_checks c ON c.specimen_id = s.id AND c.state = 'approved'
			 WHERE s.object_number = 'STC.1902.017' ORDER BY c.checked_on DESC LIMIT 1`,
		);
		const v = airspaceVerdict({ jar: { shape: 'oval', widthMm: j!.w, depthMm: j!.d, heightMm: j!.h }, material: 'soda-lime', percentVol: j!.real, levelMm: j!.level, fillTempC: j!.temp }, 24);
		expect(octopus).toMatchObject({ warmestC: 24, fillTempC: j!.temp, fluidBasis: 'measured', levelMm: j!.level });
		expect(octopus.drawOffMl).toBeCloseTo(v.drawOffMl, 9);
		expect(octopus.drawOffMm).toBeGreaterThan(0.5);
		// The cooler spirit store B would suit it; the demo's coolest store has no cooler demo store to send its
		// jar to (other test files add stores of their own, so only the demo's are named here).
		expect(octopus.saferStores.map((s) => s.code)).toContain('SPR-B1');
		for (const s of octopus.saferStores) expect(s.tempMaxC).toBeLessThan(24);
		const demoStores = ['SPR-A1', 'SPR-A2', 'SPR-B1', 'FRM-1', 'GAL-2', 'QRT-1'];
		expect(o.airspace.rows.find((r) => r.objectNumber === 'STC.1923.004')!.saferStores.filter((s) => demoStores.includes(s.code))).toEqual([]);
		expect(o.airspace.locationsWithoutTemperature).toBeGreaterThanOrEqual(1);
		for (const r of o.airspace.rows) expect(r.levelMm).toBeGreaterThan(r.safeLevelMm);
	});
});
