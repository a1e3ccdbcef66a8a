import { describe, expect, it } from 'vitest';
import {
	completeMapping,
	fileProblem,
	guessMapping,
	ImportMappingSchema,
	IMPORT_FIELDS,
	rowToSpecimen,
	type CsvRow,
	type ImportMapping,
} from '../../src/lib/specimen/csvImport.ts';
import { readHazards, readMm, undefuse } from '../../src/lib/specimen/csvCells.ts';
import { EXPORT_COLUMNS } from '../../src/lib/server/specimens/csv.ts';

/** Reading a spreadsheet row into a specimen record: the column guess, each kind of cell, the errors. */
const LOC = '11111111-1111-4111-8111-111111111111';
const locations = new Map([['SPR-A1', LOC]]);
const identity = Object.fromEntries(IMPORT_FIELDS.map((f) => [f, f])) as ImportMapping;

const good: CsvRow = {
	object_number: 'IMP.1',
	title: 'Test jar',
	description: '',
	department: '',
	location_code: 'SPR-A1',
	preservative_recorded: '70% ethanol',
	preservative_kind: 'ethanol',
	container_shape: 'cylinder',
	inner_width_mm: '90',
	inner_depth_mm: '',
	inner_height_mm: '180',
	container_material: 'soda-lime',
	closure_type: 'glass-lid',
	seal_type: 'silicone',
	hazards: '',
	next_check_due: '',
};
const read = (patch: Partial<Record<string, string>>, mapping = identity) =>
	rowToSpecimen({ ...good, ...patch } as CsvRow, mapping, locations);

describe('the column guess', () => {
	it('matches field names in any case, with spaces, underscores or a unit, and common synonyms', () => {
		const m = guessMapping(['Object Number', 'TITLE', 'Inner width (mm)', 'inner-height', 'Location', 'Accession No.', 'Notes', 'seal type']);
		expect(m).toEqual({
			'Object Number': 'object_number',
			TITLE: 'title',
			'Inner width (mm)': 'inner_width_mm',
			'inner-height': 'inner_height_mm',
			Location: 'location_code',
			// object_number is taken by the first column that names it.
			'Accession No.': 'ignore',
			Notes: 'ignore',
			'seal type': 'seal_type',
		});
		expect(guessMapping(['Accession number'])).toEqual({ 'Accession number': 'object_number' });
	});
	it('maps an export of the register onto itself', () => {
		expect(guessMapping([...EXPORT_COLUMNS])).toEqual(identity);
	});
	it('refuses a mapping that fills one field from two columns, or names an unknown field', () => {
		const twice = ImportMappingSchema.safeParse({ A: 'title', B: 'title', C: 'ignore' });
		expect(twice.success).toBe(false);
		expect(twice.error?.issues[0]?.message).toMatch(/“A” and “B” are both mapped to title/);
		expect(ImportMappingSchema.safeParse({ A: 'role' }).success).toBe(false);
		expect(ImportMappingSchema.safeParse({ A: 'title', B: 'ignore', C: 'ignore' }).success).toBe(true);
	});
	it('completes a mapping over the file’s columns and refuses a column the file does not have', () => {
		expect(completeMapping(['a', 'b'], { a: 'title' })).toEqual({ ok: true, value: { a: 'title', b: 'ignore' } });
		const r = completeMapping(['a'], { z: 'title' });
		expect(r.ok).toBe(false);
		expect(!r.ok && r.error).toMatch(/no column named “z”/);
	});
});

describe('reading cells', () => {
	it('reads sizes with a decimal point or comma and an optional unit, and nothing it would have to guess', () => {
		expect(readMm('90', true)).toEqual({ ok: true, value: 90 });
		expect(readMm('90,5', true)).toEqual({ ok: true, value: 90.5 });
		expect(readMm('90.5 mm', true)).toEqual({ ok: true, value: 90.5 });
		expect(readMm('', false)).toEqual({ ok: true, value: null });
		for (const bad of ['1,234.5', 'ninety', '9o', '90 cm', '']) expect(readMm(bad, true).ok, bad).toBe(false);
	});
	it('reads hazards as the export writes them, flags by value or label, notes after a colon', () => {
		expect(readHazards('flammable-spirit: 70% ethanol | formaldehyde')).toEqual({
			ok: true,
			value: [{ flag: 'flammable-spirit', note: '70% ethanol' }, { flag: 'formaldehyde', note: '' }],
		});
		// The label itself contains a colon: the longest match is the flag, the rest the note.
		expect(readHazards('Unknown fluid: presume toxic and flammable: cloudy | LEAD (lid lining or seal)')).toEqual({
			ok: true,
			value: [{ flag: 'unknown-fluid', note: 'cloudy' }, { flag: 'lead', note: '' }],
		});
		expect(readHazards('')).toEqual({ ok: true, value: [] });
		const bad = readHazards('flammable-spirit | radium');
		expect(bad.ok).toBe(false);
		expect(!bad.ok && bad.error).toMatch(/“radium” is not a known hazard/);
		// A flag must end at the colon: "leaded" is not "lead".
		expect(readHazards('leaded glass').ok).toBe(false);
	});
	it('removes the apostrophe the export puts before formula-like cells, and only that one', () => {
		expect(undefuse("'=SUM(A1)")).toBe('=SUM(A1)');
		expect(undefuse("'-20 °C store")).toBe('-20 °C store');
		expect(undefuse("'@home")).toBe('@home');
		expect(undefuse("'t Hooft collection")).toBe("'t Hooft collection");
		expect(undefuse('  plain  ')).toBe('plain');
	});
});

describe('a row as a specimen record', () => {
	it('reads a good row, with the location resolved and the defaults filled', () => {
		const r = read({});
		expect(r).toEqual({
			ok: true,
			value: expect.objectContaining({ objectNumber: 'IMP.1', storageLocationId: LOC, innerWidthMm: 90, innerDepthMm: null, hazards: [], nextCheckDue: null }),
		});
	});
	it('accepts vocabulary terms as stored values or as labels, in any case', () => {
		const r = read({ container_material: 'Soda-lime glass', preservative_kind: 'INDUSTRIAL METHYLATED SPIRIT', seal_type: 'pitch / bitumen', closure_type: 'screw-cap' });
		expect(r.ok && r.value).toMatchObject({ containerMaterial: 'soda-lime', preservativeKind: 'industrial-spirit', sealType: 'pitch', closureType: 'screw-cap' });
		const bad = read({ container_material: 'lead crystal' });
		expect(!bad.ok && bad.errors).toEqual([expect.stringMatching(/^container_material: “lead crystal” is not a known term; use one of: soda-lime \(Soda-lime glass\)/)]);
	});
	it('takes a formula-defused title back to what was exported', () => {
		const r = read({ title: "'=Jar of eels" });
		expect(r.ok && r.value.title).toBe('=Jar of eels');
	});
	it('names the column in every error, by the file’s own column name', () => {
		const mapping = { ...identity } as Record<string, string>;
		delete mapping.inner_width_mm;
		mapping['Breite (mm)'] = 'inner_width_mm';
		const r = rowToSpecimen(
			{ ...good, 'Breite (mm)': 'breit', location_code: 'NOWHERE', next_check_due: '31/03/2026', container_shape: 'oval', title: '' },
			mapping as ImportMapping,
			locations,
		);
		expect(r.ok).toBe(false);
		const errors = r.ok ? [] : r.errors;
		expect(errors).toContainEqual(expect.stringMatching(/^Breite \(mm\): “breit” is not a number/));
		expect(errors).toContainEqual(expect.stringMatching(/^location_code: No storage location has the code “NOWHERE”/));
		expect(errors).toContainEqual(expect.stringMatching(/^next_check_due: “31\/03\/2026” is not a date in the form YYYY-MM-DD/));
		expect(errors).toContainEqual('title: Give a title.');
		for (const e of errors) expect(e).toMatch(/^(Breite \(mm\)|location_code|next_check_due|title|inner_depth_mm): /);
	});
	it('says plainly when a text is too long', () => {
		const r = read({ title: 'x'.repeat(201) });
		expect(!r.ok && r.errors).toEqual(['title: Has more than 200 characters.']);
	});
	it('reports the record rules by column too (an oval needs its minor axis)', () => {
		const r = read({ container_shape: 'Oval (elliptic)', inner_depth_mm: '' });
		expect(!r.ok && r.errors).toEqual(['inner_depth_mm: Give the second inner dimension.']);
	});
	it('asks for the fields a new specimen needs when no column fills them, and takes them from the record it updates', () => {
		const few = { object_number: 'object_number', next_check_due: 'next_check_due' } as ImportMapping;
		const row = { object_number: 'IMP.1', next_check_due: '2027-01-15' };
		const fresh = rowToSpecimen(row, few, locations);
		expect(!fresh.ok && fresh.errors).toContainEqual('title (no column): A new specimen needs this field; map a column to it.');
		const base = read({});
		if (!base.ok) throw new Error('the good row is not good');
		const update = rowToSpecimen(row, few, locations, { ...base.value, title: 'Kept title' });
		expect(update.ok && update.value).toMatchObject({ title: 'Kept title', storageLocationId: LOC, nextCheckDue: '2027-01-15' });
	});
	it('checks a file before it is read: a .csv of at most 5 MB', () => {
		expect(fileProblem({ name: 'register.csv', size: 1000 })).toBeNull();
		expect(fileProblem({ name: 'register.xlsx', size: 1000 })).toMatch(/not a \.csv file/);
		expect(fileProblem({ name: 'big.CSV', size: 6 * 1024 * 1024 })).toMatch(/larger than 5 MB/);
	});
});
