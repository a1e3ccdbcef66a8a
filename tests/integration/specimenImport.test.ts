import { createHash } from 'node:crypto';
import Papa from 'papaparse';
import { beforeAll, describe, expect, it } from 'vitest';
import { call, useTestDatabase } from '../helpers/server.ts';
import { cookieFor, makeUser } from '../helpers/users.ts';
import { AuditEvent, Specimen } from '../../src/lib/server/models/index.ts';
import { IMPORT_FIELDS, type ImportMapping, type ImportPreview } from '../../src/lib/specimen/csvImport.ts';

/**
 * CSV import over HTTP against the built server: the preview, all-or-nothing commit, re-import by
 * object number, the audit trail, the export → import round trip and who may import. Object
 * numbers are unique to this run, since other test files share the database.
 */
let conservator = '';
let curator = '';
let reviewer = '';
beforeAll(async () => {
	useTestDatabase();
	conservator = await cookieFor((await makeUser('conservator', { tag: 'import' })).user.id);
	curator = await cookieFor((await makeUser('curator', { tag: 'import' })).user.id);
	reviewer = await cookieFor((await makeUser('reviewer', { tag: 'import' })).user.id);
});

const run = `IMP-${process.pid}-${Date.now() % 1_000_000}`;
let batches = 0;
/** A fresh set of object numbers for one test. */
const numbersFor = (count: number) => {
	const b = ++batches;
	return Array.from({ length: count }, (_, i) => `${run}-${b}-${i + 1}`);
};

const identity = Object.fromEntries(IMPORT_FIELDS.map((f) => [f, f])) as ImportMapping;
type Row = Partial<Record<(typeof IMPORT_FIELDS)[number], string>>;

function row(objectNumber: string, patch: Row = {}): Row {
	return {
		object_number: objectNumber,
		title: `Jar ${objectNumber}`,
		location_code: 'SPR-A1',
		preservative_recorded: '70% ethanol (label, 1962)',
		preservative_kind: 'Ethanol',
		container_shape: 'cylinder',
		inner_width_mm: '90,5',
		inner_height_mm: '180',
		container_material: 'soda-lime',
		closure_type: 'Ground-glass stopper',
		seal_type: 'silicone',
		hazards: 'flammable-spirit: about 70% | formaldehyde',
		next_check_due: '2027-03-01',
		...patch,
	};
}

const csvOf = (rows: Row[]) =>
	Papa.unparse({ fields: [...IMPORT_FIELDS], data: rows.map((r) => IMPORT_FIELDS.map((f) => r[f] ?? '')) }, { newline: '\r\n' });

const preview = (csv: string, mapping?: ImportMapping, cookie = conservator) =>
	call('/api/specimens/import/preview', { cookie, json: mapping ? { csv, mapping } : { csv } });
const commit = (csv: string, mapping: ImportMapping = identity, cookie = conservator) =>
	call('/api/specimens/import/commit', { cookie, json: { csv, mapping } });
const previewOf = async (csv: string): Promise<ImportPreview> => {
	const res = await preview(csv);
	expect(res.status).toBe(200);
	return (await res.json()).preview;
};
const countOf = (numbers: string[]) => Specimen.count({ where: { objectNumber: numbers } });

describe('previewing an import', () => {
	it('shows what each row of a good file would do, guesses the mapping and writes nothing', async () => {
		const numbers = numbersFor(3);
		const p = await previewOf(csvOf(numbers.map((n) => row(n))));
		expect(p.headers).toEqual([...IMPORT_FIELDS]);
		expect(p.mapping).toEqual(identity);
		expect(p.counts).toEqual({ new: 3, update: 0, unchanged: 0, error: 0 });
		expect(p.rows.map((r) => [r.row, r.objectNumber, r.status])).toEqual(numbers.map((n, i) => [i + 2, n, 'new']));
		expect(await countOf(numbers)).toBe(0);
	});

	it('marks both rows of an object number the file has twice', async () => {
		const [a, b] = numbersFor(2);
		const p = await previewOf(csvOf([row(a!), row(b!), row(a!, { title: 'Same number again' })]));
		expect(p.rows.map((r) => r.status)).toEqual(['error', 'new', 'error']);
		expect(p.rows[0]!.errors.join(' ')).toMatch(/object_number: .* is in row 4 too/);
		expect(p.rows[2]!.errors.join(' ')).toMatch(/is in row 2 too/);
	});

	it('refuses a file that cannot be an import: empty, repeated column names, too many rows, too large', async () => {
		const cases: [string, number, RegExp][] = [
			['', 400, /no header row/],
			['\r\n\r\n', 400, /no header row/],
			['object_number,title,title\r\nX,a,b', 400, /both named “title”/],
			['object_number,title', 400, /no rows under its header/],
			[`object_number\r\n${'X\r\n'.repeat(20_001)}`, 413, /at most 20,000/],
			[`object_number\r\n${'x'.repeat(5 * 1024 * 1024)}`, 413, /larger than 5 MB/],
			['object_number,title\r\nA,Caf\uFFFD', 400, /not UTF-8/],
		];
		for (const [csv, status, message] of cases) {
			const res = await preview(csv);
			expect(res.status, csv.slice(0, 40)).toBe(status);
			expect((await res.json()).error).toMatch(message);
		}
		const unknownColumn = await preview('object_number\r\nX', { object_number: 'object_number', nope: 'title' });
		expect(unknownColumn.status).toBe(400);
		const twice = await preview('a,b\r\nX,Y', { a: 'title', b: 'title' });
		expect(twice.status).toBe(400);
	});
});

describe('committing an import', () => {
	it('refuses the whole file with 422 when one row is broken, and writes nothing', async () => {
		const numbers = numbersFor(3);
		const csv = csvOf([row(numbers[0]!), row(numbers[1]!, { inner_width_mm: 'wide', seal_type: 'putty' }), row(numbers[2]!)]);
		const before = await countOf(numbers);
		const res = await commit(csv);
		expect(res.status).toBe(422);
		const body = await res.json();
		expect(body.error).toMatch(/1 row has errors, so nothing was imported/);
		expect(body.preview.counts).toEqual({ new: 2, update: 0, unchanged: 0, error: 1 });
		const broken = body.preview.rows.find((r: { row: number }) => r.row === 3);
		expect(broken.errors).toEqual([expect.stringMatching(/^inner_width_mm: “wide” is not a number/), expect.stringMatching(/^seal_type: “putty” is not a known term/)]);
		expect(before).toBe(0);
		expect(await countOf(numbers)).toBe(0);
	});

	describe('a good file, then the same file again, then one changed cell', () => {
		const numbers = numbersFor(3);
		const rows = numbers.map((n) => row(n));
		const csv = csvOf(rows);

		it('creates every row, each with its audit event, and one summary event for the file', async () => {
			const res = await commit(csv);
			expect(res.status).toBe(200);
			const { result } = await res.json();
			expect(result).toMatchObject({ created: 3, updated: 0, unchanged: 0 });
			expect(result.sha256).toBe(createHash('sha256').update(csv, 'utf8').digest('hex'));
			const made = await Specimen.findAll({ where: { objectNumber: numbers } });
			expect(made).toHaveLength(3);
			const one = made.find((s) => s.objectNumber === numbers[0])!;
			expect(one.innerWidthMm).toBe(90.5);
			expect(one.closureType).toBe('ground-glass-stopper');
			expect(one.hazards).toEqual([{ flag: 'flammable-spirit', note: 'about 70%' }, { flag: 'formaldehyde', note: '' }]);
			expect(one.storageLocationId).not.toBeNull();
			const events = await AuditEvent.findAll({ where: { action: 'specimen.import-create', entityId: made.map((s) => s.id) } });
			expect(events).toHaveLength(3);
			expect((events[0]!.after as { objectNumber: string }).objectNumber).toMatch(new RegExp(`^${run}`));
			const summary = await AuditEvent.findOne({ where: { action: 'specimen.import', entityId: result.sha256 } });
			expect(summary?.after).toMatchObject({ created: 3, updated: 0, unchanged: 0, rows: 3 });
		});

		it('finds every row unchanged on a second import, and adds no duplicates', async () => {
			const p = await previewOf(csv);
			expect(p.counts).toEqual({ new: 0, update: 0, unchanged: 3, error: 0 });
			const res = await commit(csv);
			expect(res.status).toBe(200);
			expect((await res.json()).result).toMatchObject({ created: 0, updated: 0, unchanged: 3 });
			expect(await countOf(numbers)).toBe(3);
		});

		it('updates the record whose cell changed, with an audit event of just that change', async () => {
			const changed = csvOf([rows[0]!, { ...rows[1]!, title: 'Renamed by import' }, rows[2]!]);
			const p = await previewOf(changed);
			expect(p.rows.map((r) => r.status)).toEqual(['unchanged', 'update', 'unchanged']);
			expect(p.rows[1]!.changes).toEqual(['title']);
			const before = (await Specimen.findOne({ where: { objectNumber: numbers[1]! } }))!;
			const res = await commit(changed);
			expect(res.status).toBe(200);
			expect((await res.json()).result).toMatchObject({ created: 0, updated: 1, unchanged: 2 });
			const after = (await Specimen.findOne({ where: { objectNumber: numbers[1]! } }))!;
			expect(after.title).toBe('Renamed by import');
			expect(after.version).toBe(before.version + 1);
			const event = await AuditEvent.findOne({ where: { action: 'specimen.import-update', entityId: after.id } });
			expect(event?.before).toEqual({ title: `Jar ${numbers[1]}` });
			expect(event?.after).toEqual({ title: 'Renamed by import' });
			expect(await countOf(numbers)).toBe(3);
		});

		it('updates only the columns a partial file maps, keeping the rest of the record', async () => {
			const partial = `Accession number;Next check\r\n${numbers[2]};2028-06-30\r\n`;
			const p = await previewOf(partial);
			expect(p.mapping).toEqual({ 'Accession number': 'object_number', 'Next check': 'next_check_due' });
			expect(p.rows[0]).toMatchObject({ status: 'update', changes: ['Next check'] });
			expect((await commit(partial, p.mapping)).status).toBe(200);
			const s = (await Specimen.findOne({ where: { objectNumber: numbers[2]! } }))!;
			expect(s.nextCheckDue).toBe('2028-06-30');
			expect(s.title).toBe(`Jar ${numbers[2]}`);
		});
	});

	it('imports an export of the register as it is: every row unchanged', async () => {
		const numbers = numbersFor(3);
		const tricky = [
			row(numbers[0]!, { title: '=Formula-looking title', description: 'Line one\nline two, with "quotes"' }),
			row(numbers[1]!, { container_shape: 'oval', inner_width_mm: '120', inner_depth_mm: '80.5', hazards: '', location_code: '', next_check_due: '' }),
			row(numbers[2]!, { hazards: 'Unknown fluid: presume toxic and flammable: cloudy, smells of pitch', seal_type: 'Pitch / bitumen' }),
		];
		expect((await commit(csvOf(tricky))).status).toBe(200);
		const batch = numbers[0]!.replace(/1$/, '');
		const exported = await call(`/api/specimens/export?q=${encodeURIComponent(batch)}`, { cookie: conservator });
		expect(exported.status).toBe(200);
		const text = await exported.text();
		expect(text).toContain("'=Formula-looking title");
		const p = await previewOf(text);
		expect(p.rows.map((r) => [r.objectNumber, r.status])).toEqual(numbers.map((n) => [n, 'unchanged']));
	});
});

describe('who may import', () => {
	it('refuses curators and reviewers, for the page, the preview and the commit, and writes nothing', async () => {
		const numbers = numbersFor(1);
		const csv = csvOf([row(numbers[0]!)]);
		for (const cookie of [curator, reviewer]) {
			expect((await preview(csv, undefined, cookie)).status).toBe(403);
			expect((await commit(csv, identity, cookie)).status).toBe(403);
			expect((await call('/specimens/import', { cookie })).status).toBe(403);
		}
		expect(await countOf(numbers)).toBe(0);
		expect((await call('/specimens/import', { cookie: conservator })).status).toBe(200);
	});
});
