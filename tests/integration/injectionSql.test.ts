import { Op } from 'sequelize';
import { beforeAll, describe, expect, it } from 'vitest';
import { call, useTestDatabase } from '../helpers/server.ts';
import { signedInUser } from '../helpers/users.ts';
import { specimenRecord } from '../helpers/specimens.ts';
import { Specimen } from '../../src/lib/server/models/index.ts';
import { RegisterQuerySchema } from '../../src/lib/specimen/query.ts';
import { OverviewQuerySchema } from '../../src/lib/overview/schema.ts';
import { CheckExportQuerySchema } from '../../src/lib/check/exportQuery.ts';

/**
 * TESTPLAN B6, SQL (ASVS 5.0 1.2.4 parameterised queries, 2.2.1 validation; WSTG INPV-05): SQL, LIKE
 * wildcards, quotes, backslashes and a NUL in every parameter of the register, its export, the
 * overview, the checks export and the lists, and in ids in the path. No answer is a 500; free text is
 * matched literally; nothing else changes. The parameters come from the query schemas themselves, so
 * a new filter is covered when it is added. (specimens.test.ts has the first search-text case.)
 */
let cookie: string;
const tag = `SQLI${process.pid}`;
const title = `Newt ${tag} '); DROP TABLE specimens; --`;
// No "%" in what is stored: specimens.test.ts counts on no record holding one.
const department = `O'Brien "wet" 100_\\ ${tag}`;

const PAYLOADS = ["' OR 1=1 --", "'); DROP TABLE specimens; --", "%' UNION SELECT password_hash FROM users --", '\\', '%_%', '$1', "'::int", '1)) OR pg_sleep(5) --', '\u0000', `${'x'.repeat(99)}'`];

beforeAll(async () => {
	useTestDatabase();
	({ cookie } = await signedInUser('conservator', 'sqli'));
	for (const over of [{ title, department }, { title: `Newt ${tag} plain`, department: `Plain ${tag}` }]) {
		expect((await call('/api/specimens', { cookie, json: specimenRecord(tag, over) })).status).toBe(201);
	}
});

/** This file's own specimens, whole, as stored (other files add specimens meanwhile). */
const mine = async () => (await Specimen.findAll({ where: { department: { [Op.in]: [department, `Plain ${tag}`] } }, order: [['id', 'ASC']], raw: true })).map((r) => JSON.stringify(r));

const rows = async (qs: Record<string, string>) => {
	const res = await call(`/api/specimens?${new URLSearchParams(qs)}`, { cookie });
	expect(res.status).toBe(200);
	return ((await res.json()) as { rows: { title: string }[] }).rows.map((r) => r.title);
};

describe('SQL in the register’s search and filters', () => {
	it('matches text holding quotes, wildcards, backslashes and SQL literally, and only that', async () => {
		expect(await rows({ q: `${tag} '); DROP` })).toEqual([title]);
		expect(await rows({ department })).toEqual([title]);
		// A LIKE wildcard or an escape in the text is a character, not a pattern.
		expect(await rows({ q: `${tag}%` })).toEqual([]);
		expect(await rows({ q: 'Newt _' })).toEqual([]);
		expect(await rows({ department: `O'Brien "wet" 100_` })).toEqual([]);
	});

	it('answers every payload in every parameter with 200 or 400, never a 500, and changes nothing', async () => {
		const before = await mine();
		expect(before).toHaveLength(2);
		const targets: [string, string[]][] = [
			['/api/specimens', Object.keys(RegisterQuerySchema.shape)],
			['/api/specimens/export', Object.keys(RegisterQuerySchema.shape)],
			['/api/overview', Object.keys(OverviewQuerySchema.shape)],
			['/api/checks/export.csv', Object.keys(CheckExportQuerySchema.shape)],
			['/api/checks', ['view']],
			['/api/uploads/status', ['id']],
		];
		for (const [path, params] of targets) {
			for (const p of params) {
				for (const payload of PAYLOADS) {
					const res = await call(`${path}?${new URLSearchParams({ [p]: payload })}`, { cookie });
					expect([200, 400], `${path}?${p}=${JSON.stringify(payload)}: ${res.status}`).toContain(res.status);
				}
			}
		}
		expect(await mine()).toEqual(before);
	});

	it('answers an id made of SQL with the missing-record 404', async () => {
		for (const payload of PAYLOADS) {
			const id = encodeURIComponent(payload);
			for (const path of [`/api/specimens/${id}`, `/api/checks/${id}`, `/api/photos/${id}`, `/api/comparisons/${id}`, `/api/specimens/${id}/timeline`]) {
				expect((await call(path, { cookie })).status, `${path}`).toBe(404);
			}
		}
	});
});
