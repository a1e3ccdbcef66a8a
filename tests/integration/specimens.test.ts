import Papa from 'papaparse';
import { beforeAll, describe, expect, it } from 'vitest';
import { call, useTestDatabase } from '../helpers/server.ts';
import { specimenRecord } from '../helpers/specimens.ts';
import { cookieFor, makeUser } from '../helpers/users.ts';
import { AuditEvent, Specimen, StorageLocation } from '../../src/lib/server/models/index.ts';
import { createSpecimen } from '../../src/lib/server/specimens/service.ts';
import { SpecimenSchema } from '../../src/lib/specimen/schema.ts';

/** The register over HTTP: create, read, edit with optimistic locking, audit trail, export. */
const prefix = `RT${process.pid}`;
const record = (over: Record<string, unknown> = {}) => specimenRecord(prefix, over);
const objectNumber = () => specimenRecord(prefix).objectNumber;

let conservator = '';
let curator = '';
let reviewer = '';
let conservatorId = '';
beforeAll(async () => {
	useTestDatabase();
	const c = await makeUser('conservator', { tag: 'reg' });
	conservatorId = c.user.id;
	conservator = await cookieFor(c.user.id);
	curator = await cookieFor((await makeUser('curator', { tag: 'reg' })).user.id);
	reviewer = await cookieFor((await makeUser('reviewer', { tag: 'reg' })).user.id);
});

async function create(over: Record<string, unknown> = {}) {
	const res = await call('/api/specimens', { cookie: conservator, json: record(over) });
	expect(res.status).toBe(201);
	return (await res.json()).specimen;
}

describe('registering specimens', () => {
	it('lets a conservator register a specimen, recorded in the audit trail', async () => {
		const s = await create({ department: 'Zoology teaching series' });
		expect(s).toMatchObject({ title: 'Test newt, whole', version: 0, innerDepthMm: null });
		const events = await AuditEvent.findAll({ where: { entityType: 'specimen', entityId: s.id } });
		expect(events.map((e) => e.action)).toEqual(['specimen.create']);
		expect(events[0]!.actorId).toBe(conservatorId);
	});

	it('refuses a duplicate object number with 409, and bad fields with 400 naming them', async () => {
		const s = await create();
		const dup = await call('/api/specimens', { cookie: conservator, json: record({ objectNumber: s.objectNumber }) });
		expect(dup.status).toBe(409);
		expect((await dup.json()).error).toMatch(/registered already/);
		const bad = await call('/api/specimens', { cookie: conservator, json: record({ containerShape: 'oval', innerWidthMm: -3 }) });
		expect(bad.status).toBe(400);
		const paths = (await bad.json()).fields.map((f: { path: string }) => f.path);
		expect(paths).toEqual(expect.arrayContaining(['innerWidthMm', 'innerDepthMm']));
		const forged = await call('/api/specimens', { cookie: conservator, json: { ...record(), version: 7, id: '00000000-0000-4000-8000-000000000000' } });
		expect(forged.status).toBe(400);
	});

	it('lets curators and reviewers read but not write', async () => {
		const s = await create();
		for (const cookie of [curator, reviewer]) {
			expect((await call(`/api/specimens/${s.id}`, { cookie })).status).toBe(200);
			expect((await call('/api/specimens', { cookie, json: record() })).status).toBe(403);
			expect((await call(`/api/specimens/${s.id}`, { cookie, method: 'PUT', json: { version: 0, record: record() } })).status).toBe(403);
		}
	});

	it('writes the specimen and its audit event together or not at all', async () => {
		const number = objectNumber();
		// An actor id that is not a user makes the audit insert fail after the specimen insert.
		const input = SpecimenSchema.parse(record({ objectNumber: number }));
		await expect(createSpecimen({ id: '00000000-0000-4000-8000-00000000dead', clientAddress: null }, input)).rejects.toThrow();
		expect(await Specimen.count({ where: { objectNumber: number } })).toBe(0);
	});
});

describe('editing with optimistic locking', () => {
	it('saves against the current version and refuses a stale one with 409 and the record as it is now', async () => {
		const s = await create();
		const first = await call(`/api/specimens/${s.id}`, { cookie: conservator, method: 'PUT', json: { version: 0, record: record({ objectNumber: s.objectNumber, title: 'Test newt, opened' }) } });
		expect(first.status).toBe(200);
		expect((await first.json()).specimen).toMatchObject({ title: 'Test newt, opened', version: 1 });
		const stale = await call(`/api/specimens/${s.id}`, { cookie: conservator, method: 'PUT', json: { version: 0, record: record({ objectNumber: s.objectNumber, title: 'Lost update' }) } });
		expect(stale.status).toBe(409);
		const body = await stale.json();
		expect(body.current).toMatchObject({ title: 'Test newt, opened', version: 1 });
		expect((await Specimen.findByPk(s.id))!.title).toBe('Test newt, opened');
	});

	it('lets exactly one of ten simultaneous saves of one version win', async () => {
		const s = await create();
		const saves = await Promise.all(
			Array.from({ length: 10 }, (_, i) =>
				call(`/api/specimens/${s.id}`, { cookie: conservator, method: 'PUT', json: { version: 0, record: record({ objectNumber: s.objectNumber, title: `Writer ${i}` }) } }),
			),
		);
		const statuses = saves.map((r) => r.status).sort();
		expect(statuses.filter((x) => x === 200)).toHaveLength(1);
		expect(statuses.filter((x) => x === 409)).toHaveLength(9);
		expect((await Specimen.findByPk(s.id))!.version).toBe(1);
	});

	it('keeps the before and after of each changed field, shown in the record’s history', async () => {
		const loc = await StorageLocation.findOne({ where: { code: 'SPR-B1' } });
		const s = await create();
		await call(`/api/specimens/${s.id}`, { cookie: conservator, method: 'PUT', json: { version: 0, record: record({ objectNumber: s.objectNumber, sealType: 'wax', storageLocationId: loc!.id, hazards: [] }) } });
		const h = await (await call(`/api/specimens/${s.id}/history`, { cookie: curator })).json();
		expect(h.history[0].action).toBe('specimen.update');
		const changes = Object.fromEntries(h.history[0].changes.map((c: { field: string; before: unknown; after: unknown }) => [c.field, [c.before, c.after]]));
		expect(changes.sealType).toEqual(['silicone', 'wax']);
		expect(changes.storageLocation[1]).toMatchObject({ code: 'SPR-B1' });
		expect(changes.hazards).toEqual([[{ flag: 'flammable-spirit', note: '' }], []]);
		expect(h.history[1].action).toBe('specimen.create');
	});
});

describe('the register view', () => {
	beforeAll(async () => {
		await create({ title: `Alpha squid ${prefix}`, preservativeKind: 'formalin', hazards: [{ flag: 'formaldehyde', note: '' }], nextCheckDue: '2020-01-01' });
		await create({ title: `Beta squid ${prefix}`, preservativeKind: 'ethanol', nextCheckDue: '2099-01-01' });
	});

	it('searches, filters, sorts and pages on the server', async () => {
		const page = async (qs: string) => (await call(`/api/specimens?${qs.startsWith('q=') ? '' : `q=${prefix}&`}${qs}`, { cookie: curator })).json();
		const squid = await page(`q=${encodeURIComponent(`squid ${prefix}`)}`);
		expect(squid.rows.map((r: { title: string }) => r.title)).toEqual([`Alpha squid ${prefix}`, `Beta squid ${prefix}`]);
		expect((await page(`q=${encodeURIComponent(`squid ${prefix}`)}&sort=title&dir=desc`)).rows[0].title).toBe(`Beta squid ${prefix}`);
		const formalin = await page('preservative=formalin&hazard=formaldehyde&due=overdue');
		expect(formalin.rows.every((r: { preservativeKind: string }) => r.preservativeKind === 'formalin')).toBe(true);
		expect(formalin.total).toBeGreaterThanOrEqual(1);
		const mine = await page('pageSize=10');
		expect(mine.rows.length).toBeLessThanOrEqual(10);
		expect(mine.total).toBeGreaterThanOrEqual(mine.rows.length);
	});

	it('treats search text literally (no SQL, no LIKE wildcards) and refuses unknown filter values', async () => {
		const inj = await call(`/api/specimens?q=${encodeURIComponent("%' OR 1=1 --")}`, { cookie: curator });
		expect(inj.status).toBe(200);
		expect((await inj.json()).total).toBe(0);
		expect((await call('/api/specimens?q=%25', { cookie: curator }).then((r) => r.json())).total).toBe(0);
		expect((await call('/api/specimens?preservative=gin', { cookie: curator })).status).toBe(400);
	});

	it('exports the filtered view as CSV that reads back to the same records', async () => {
		const res = await call(`/api/specimens/export?q=${prefix}`, { cookie: curator });
		expect(res.headers.get('content-type')).toMatch(/text\/csv/);
		expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="meniscus-register-\d{4}-\d{2}-\d{2}\.csv"$/);
		const parsed = Papa.parse<Record<string, string>>((await res.text()).replace(/^\uFEFF/, ''), { header: true, skipEmptyLines: true });
		const api = await (await call(`/api/specimens?q=${prefix}&pageSize=200`, { cookie: curator })).json();
		expect(parsed.data.map((r) => r.object_number).sort()).toEqual(api.rows.map((r: { objectNumber: string }) => r.objectNumber).sort());
		const alpha = parsed.data.find((r) => r.title === `Alpha squid ${prefix}`)!;
		expect(alpha).toMatchObject({ preservative_kind: 'formalin', inner_width_mm: '80', hazards: 'formaldehyde', next_check_due: '2020-01-01' });
	});

	it('defuses cells a spreadsheet would run as formulas', async () => {
		await create({ title: '=HYPERLINK("http://evil.example")' });
		const csv = await (await call(`/api/specimens/export?q=${encodeURIComponent('HYPERLINK')}`, { cookie: curator })).text();
		expect(csv).toContain(`"'=HYPERLINK(""http://evil.example"")"`);
	});
});

describe('the top of the specimen', () => {
	it('is kept on the record, exported, and refused above the inner height', async () => {
		const s = await create({ specimenTopMm: 118.5 });
		expect(s.specimenTopMm).toBe(118.5);
		const csv = Papa.parse<Record<string, string>>((await (await call(`/api/specimens/export?q=${s.objectNumber}`, { cookie: curator })).text()).replace(/^\uFEFF/, ''), { header: true, skipEmptyLines: true });
		expect(csv.data[0]).toMatchObject({ object_number: s.objectNumber, specimen_top_mm: '118.5' });
		const bad = await call(`/api/specimens/${s.id}`, { cookie: conservator, method: 'PUT', json: { version: 0, record: record({ objectNumber: s.objectNumber, specimenTopMm: 170 }) } });
		expect(bad.status).toBe(400);
		expect((await bad.json()).fields.map((f: { path: string }) => f.path)).toContain('record.specimenTopMm');
		expect((await Specimen.findByPk(s.id))!.specimenTopMm).toBe(118.5);
	});
});

describe('the register filters the overview links to', () => {
	it('filters by collection, open check, flammable fluid and “not checked yet”', async () => {
		const s = await create({ department: `Filter series ${prefix}`, hazards: [] });
		const total = async (qs: string) => (await (await call(`/api/specimens?${qs}`, { cookie: curator })).json()).total;
		const dept = `department=${encodeURIComponent(`Filter series ${prefix}`)}`;
		expect(await total(dept)).toBe(1);
		expect(await total(`${dept}&grade=not-checked&priority=not-set`)).toBe(1);
		expect(await total(`${dept}&grade=good`)).toBe(0);
		// Ethanol is flammable spirit whether or not the record flags it.
		expect(await total(`${dept}&flammable=yes`)).toBe(1);
		expect(await total(`${dept}&check=in-review`)).toBe(0);
		expect((await call(`/api/specimens/${s.id}/checks`, { cookie: conservator, json: {} })).status).toBe(201);
		expect(await total(`${dept}&check=draft`)).toBe(1);
		expect((await call('/api/specimens?check=approved', { cookie: curator })).status).toBe(400);
	});
});
