import type { FileEntry, TableDigests } from './manifest.ts';

/**
 * What differs between what a manifest promises and what is there: used on the backup before a
 * restore touches anything, and on the restored database and folder afterwards. Pure.
 */
export type Mismatch =
	| { kind: 'file'; path: string; problem: 'missing' | 'unexpected' }
	| { kind: 'file'; path: string; problem: 'size' | 'sha256'; expected: string; actual: string }
	| { kind: 'table'; path: string; problem: 'missing' | 'unexpected' }
	| { kind: 'table'; path: string; problem: 'rows' | 'md5'; expected: string; actual: string };

export function compareFiles(expected: FileEntry[], actual: FileEntry[]): Mismatch[] {
	const found = new Map(actual.map((f) => [f.path, f]));
	const out: Mismatch[] = [];
	for (const want of expected) {
		const got = found.get(want.path);
		found.delete(want.path);
		if (!got) out.push({ kind: 'file', path: want.path, problem: 'missing' });
		else if (got.size !== want.size) out.push({ kind: 'file', path: want.path, problem: 'size', expected: String(want.size), actual: String(got.size) });
		else if (got.sha256 !== want.sha256) out.push({ kind: 'file', path: want.path, problem: 'sha256', expected: want.sha256, actual: got.sha256 });
	}
	for (const path of found.keys()) out.push({ kind: 'file', path, problem: 'unexpected' });
	return out;
}

export function compareTables(expected: TableDigests, actual: TableDigests): Mismatch[] {
	const out: Mismatch[] = [];
	for (const [name, want] of Object.entries(expected)) {
		const got = actual[name];
		if (!got) out.push({ kind: 'table', path: name, problem: 'missing' });
		else if (got.rows !== want.rows) out.push({ kind: 'table', path: name, problem: 'rows', expected: String(want.rows), actual: String(got.rows) });
		else if (got.md5 !== want.md5) out.push({ kind: 'table', path: name, problem: 'md5', expected: want.md5, actual: got.md5 });
	}
	for (const name of Object.keys(actual)) if (!(name in expected)) out.push({ kind: 'table', path: name, problem: 'unexpected' });
	return out;
}

const WHAT = {
	missing: 'is missing',
	unexpected: 'is not in the manifest',
	size: 'has another size',
	sha256: 'has another SHA-256 (its bytes changed)',
	rows: 'has another row count',
	md5: 'has other contents (md5 digest)',
} as const;

/** One line per mismatch, e.g. "file uploads/masters/ab/x.jpg has another SHA-256 …: expected …, found …". */
export function describeMismatch(m: Mismatch): string {
	const base = `${m.kind} ${m.path} ${WHAT[m.problem]}`;
	return 'expected' in m ? `${base}: expected ${m.expected}, found ${m.actual}` : base;
}

/** The first `max` lines of a mismatch list, and how many more there were. */
export function describeMismatches(list: Mismatch[], max = 20): string {
	const lines = list.slice(0, max).map((m) => `  - ${describeMismatch(m)}`);
	if (list.length > max) lines.push(`  … and ${list.length - max} more`);
	return lines.join('\n');
}
