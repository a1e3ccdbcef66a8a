import { describe, expect, it } from 'vitest';
import { compareFiles, compareTables, describeMismatch, describeMismatches } from '../../../scripts/lib/backup/compare.ts';

/** What a restore checks before and after (TESTPLAN D6: counts and hashes match; ASVS 4.0.3 8.1.6). */
const A = 'a'.repeat(64);
const B = 'b'.repeat(64);
const files = [
	{ path: 'database.dump', size: 10, sha256: A },
	{ path: 'uploads/masters/ab/x.jpg', size: 20, sha256: B },
];

describe('compareFiles', () => {
	it('finds nothing when every file is there with its size and hash', () => {
		expect(compareFiles(files, [...files].reverse())).toEqual([]);
	});

	it('reports a missing file, an extra one, another size and another hash', () => {
		const found = [
			{ path: 'database.dump', size: 11, sha256: A },
			{ path: 'uploads/extra', size: 1, sha256: A },
		];
		expect(compareFiles(files, found)).toEqual([
			{ kind: 'file', path: 'database.dump', problem: 'size', expected: '10', actual: '11' },
			{ kind: 'file', path: 'uploads/masters/ab/x.jpg', problem: 'missing' },
			{ kind: 'file', path: 'uploads/extra', problem: 'unexpected' },
		]);
		expect(compareFiles(files, [files[0]!, { ...files[1]!, sha256: A }])).toEqual([
			{ kind: 'file', path: 'uploads/masters/ab/x.jpg', problem: 'sha256', expected: B, actual: A },
		]);
	});
});

describe('compareTables', () => {
	const tables = { 'public.photos': { rows: 39, md5: '0'.repeat(32) }, 'public.users': { rows: 4, md5: '1'.repeat(32) } };

	it('finds nothing when every table has its rows and digest', () => {
		expect(compareTables(tables, { ...tables })).toEqual([]);
	});

	it('reports another row count before another digest, and missing and extra tables', () => {
		const found = { 'public.photos': { rows: 38, md5: '2'.repeat(32) }, 'public.extra': { rows: 0, md5: '1'.repeat(32) } };
		expect(compareTables(tables, found)).toEqual([
			{ kind: 'table', path: 'public.photos', problem: 'rows', expected: '39', actual: '38' },
			{ kind: 'table', path: 'public.users', problem: 'missing' },
			{ kind: 'table', path: 'public.extra', problem: 'unexpected' },
		]);
		expect(compareTables(tables, { ...tables, 'public.users': { rows: 4, md5: '3'.repeat(32) } })).toEqual([
			{ kind: 'table', path: 'public.users', problem: 'md5', expected: '1'.repeat(32), actual: '3'.repeat(32) },
		]);
	});
});

describe('describeMismatch', () => {
	it('says which file and what differs, with both values', () => {
		expect(describeMismatch({ kind: 'file', path: 'uploads/x', problem: 'sha256', expected: A, actual: B })).toBe(
			`file uploads/x has another SHA-256 (its bytes changed): expected ${A}, found ${B}`,
		);
		expect(describeMismatch({ kind: 'table', path: 'public.users', problem: 'missing' })).toBe('table public.users is missing');
	});

	it('lists at most the first lines, and says how many more', () => {
		const many = Array.from({ length: 25 }, (_, i) => ({ kind: 'file' as const, path: `f${i}`, problem: 'missing' as const }));
		const text = describeMismatches(many);
		expect(text.split('\n')).toHaveLength(21);
		expect(text).toMatch(/… and 5 more$/);
	});
});
