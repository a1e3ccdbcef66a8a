import Papa from 'papaparse';
import { QueryTypes } from 'sequelize';
import { beforeAll, describe, expect, it } from 'vitest';
import { call, useTestDatabase } from '../helpers/server.ts';
import { cookieFor, makeUser, signedInUser } from '../helpers/users.ts';
import { gradedCheck, newSpecimen } from '../helpers/checks.ts';
import { db } from '../../src/lib/server/db.ts';
import { CHECK_LABELS } from '../../src/lib/check/vocabulary.ts';
import { CHECK_EXPORT_COLUMNS } from '../../src/lib/server/checks/csv.ts';

/**
 * The condition checks CSV: parsed back with papaparse, its header, one row per check, cells a
 * spreadsheet would run as a formula defused (OWASP, "CSV Injection"), the filters, bad queries refused.
 */
let cookie: string;
let demoId: string;

async function csv(query: string): Promise<Papa.ParseResult<Record<string, string>>> {
	const res = await call(`/api/checks/export.csv${query}`, { cookie });
	expect(res.status).toBe(200);
	expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8');
	expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="meniscus-checks-\d{4}-\d{2}-\d{2}\.csv"$/);
	const parsed = Papa.parse<Record<string, string>>((await res.text()).replace(/^\uFEFF/, ''), { header: true, skipEmptyLines: true });
	expect(parsed.errors).toEqual([]);
	expect(parsed.meta.fields).toEqual([...CHECK_EXPORT_COLUMNS]);
	return parsed;
}

beforeAll(async () => {
	useTestDatabase();
	({ cookie } = await signedInUser('conservator', 'csvx'));
	const [row] = await db().query<{ id: string }>(`SELECT id FROM specimens WHERE object_number = 'STC.1898.014'`, { type: QueryTypes.SELECT });
	demoId = row!.id;
});

describe('the condition checks CSV export', () => {
	it('has one row per check of the demo specimen, oldest first, with the header', async () => {
		const { data } = await csv(`?specimen=${demoId}`);
		const checks = await db().query<{ id: string; checked_on: string }>(`SELECT id, checked_on::text AS checked_on FROM condition_checks WHERE specimen_id = :id ORDER BY checked_on, created_at`, {
			type: QueryTypes.SELECT,
			replacements: { id: demoId },
		});
		expect(checks.length).toBeGreaterThan(1);
		expect(data.map((r) => r['Check id'])).toEqual(checks.map((c) => c.id));
		expect(new Set(data.map((r) => r['Object number']))).toEqual(new Set(['STC.1898.014']));
		expect(data.map((r) => r.Date)).toEqual(checks.map((c) => c.checked_on));
	});

	it('defuses cells that a spreadsheet would run as a formula', async () => {
		const s = await newSpecimen(cookie, `CSVX.${process.pid}`);
		const opened = await (await call(`/api/specimens/${s.id}/checks`, { cookie, json: {} })).json();
		const evil = '=HYPERLINK("https://example.org/x","click")';
		const put = await call(`/api/checks/${opened.check.id}`, { cookie, method: 'PUT', json: { version: opened.check.version, check: gradedCheck(evil) } });
		expect(put.status).toBe(200);
		const { data } = await csv(`?specimen=${s.id}`);
		expect(data).toHaveLength(1);
		expect(data[0]!.Notes).toBe(`'${evil}`);
		expect(data[0]![`${CHECK_LABELS.part.seal} grade`]).toBe('fair');
		expect(data[0]!.State).toBe('draft');
		for (const row of data) for (const v of Object.values(row)) expect(v).not.toMatch(/^[=+\-@\t\r]/);
	});

	it('defuses every character a spreadsheet starts a formula with, in the notes and in the examiner’s name', async () => {
		// TESTPLAN B6; OWASP "CSV Injection"; ASVS 5.0 1.2.10: = + - @ tab and CR lead a formula.
		const { user } = await makeUser('conservator', { tag: 'csvx-name' });
		await user.update({ name: '@SUM(1+1)*cmd|/c calc' });
		const examiner = await cookieFor(user.id);
		const s = await newSpecimen(examiner, `CSVY.${process.pid}`);
		for (const notes of ['=1+1', '+1+1', '-1+1', '@SUM(A1)']) {
			const opened = await (await call(`/api/specimens/${s.id}/checks`, { cookie: examiner, json: {} })).json();
			expect((await call(`/api/checks/${opened.check.id}`, { cookie: examiner, method: 'PUT', json: { version: opened.check.version, check: gradedCheck(notes) } })).status).toBe(200);
		}
		const { data } = await csv(`?specimen=${s.id}`);
		expect(data.map((r) => r.Notes).sort()).toEqual(["'+1+1", "'-1+1", "'=1+1", "'@SUM(A1)"]);
		for (const row of data) expect(row.Examiner).toBe("'@SUM(1+1)*cmd|/c calc");
	});

	it('filters by a range of days', async () => {
		const all = (await csv(`?specimen=${demoId}`)).data.map((r) => r.Date ?? '');
		const from = all[1]!;
		const to = all.at(-1)!;
		const some = (await csv(`?specimen=${demoId}&from=${from}&to=${to}`)).data.map((r) => r.Date);
		expect(some).toEqual(all.filter((d) => d >= from && d <= to));
		const one = (await csv(`?from=${from}&to=${from}`)).data;
		expect(one.length).toBeGreaterThan(0);
		for (const r of one) expect(r.Date).toBe(from);
	});

	it('refuses a bad query, and people signed out', async () => {
		for (const q of ['?from=31/03/2026', '?specimen=nope', '?from=2026-05-01&to=2026-04-01', '?colour=red']) {
			expect((await call(`/api/checks/export.csv${q}`, { cookie })).status).toBe(400);
		}
		expect((await call('/api/checks/export.csv')).status).toBe(401);
	});
});
