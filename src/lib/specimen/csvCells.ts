import { HAZARD_FLAGS, LABELS, type HazardFlag } from './vocabulary.ts';

/**
 * Reading one spreadsheet cell into one field of a specimen record. Each reader either gives the
 * value or says, in words a person can act on, what is wrong with the cell; the caller adds the
 * column's name. Cells are text as a spreadsheet saved them, so the readers are lenient about the
 * forms people type (a decimal comma, a vocabulary label instead of its stored value) and strict
 * about anything they would have to guess.
 */
export type Cell<T> = { ok: true; value: T } | { ok: false; error: string };

const ok = <T>(value: T): Cell<T> => ({ ok: true, value });
const bad = (error: string): Cell<never> => ({ ok: false, error });
const quote = (s: string) => `“${s.length > 40 ? `${s.slice(0, 40)}…` : s}”`;

/**
 * The cell without surrounding space and without the apostrophe our export puts before a value that
 * a spreadsheet would run as a formula (csv.ts). Only that apostrophe is removed: one before any
 * other character is part of the value.
 */
export function undefuse(raw: string): string {
	const t = raw.trim();
	return /^'[=+\-@\t\r]/.test(t) ? t.slice(1).trim() : t;
}

/** A size in millimetres: digits with a decimal point or comma, and an optional "mm" after. */
export function readMm(cell: string, required: boolean): Cell<number | null> {
	if (cell === '') return required ? bad('Is empty; give the size in mm, such as 90 or 90,5.') : ok(null);
	const t = cell.replace(/\s*mm$/i, '');
	if (!/^[+-]?\d+([.,]\d+)?$/.test(t)) {
		return bad(`${quote(cell)} is not a number; write digits with at most one decimal point or comma, such as 90 or 90,5.`);
	}
	return ok(Number(t.replace(',', '.')));
}

/**
 * A term from a fixed vocabulary, given either as the stored value (`soda-lime`) or as the label
 * people see (`Soda-lime glass`), in any letter case.
 */
export function readTerm<V extends string>(cell: string, labels: Readonly<Record<V, string>>): Cell<V> {
	const found = findTerm(cell, labels);
	if (found) return ok(found);
	const choices = Object.entries<string>(labels).map(([v, l]) => `${v} (${l})`).join(', ');
	return bad(`${cell === '' ? 'Is empty' : `${quote(cell)} is not a known term`}; use one of: ${choices}.`);
}

function findTerm<V extends string>(cell: string, labels: Readonly<Record<V, string>>): V | null {
	const want = cell.trim().toLowerCase();
	if (want === '') return null;
	for (const [value, label] of Object.entries<string>(labels)) {
		if (value.toLowerCase() === want || label.toLowerCase() === want) return value as V;
	}
	return null;
}

/**
 * Hazards as the export writes them: `flag: note | flag`, separated by a vertical bar. A flag may be
 * its value or its label; since some labels contain a colon themselves, the longest flag or label
 * the part starts with is taken, and whatever follows its colon is the note.
 */
export function readHazards(cell: string): Cell<{ flag: HazardFlag; note: string }[]> {
	const out: { flag: HazardFlag; note: string }[] = [];
	for (const part of cell.split('|').map((p) => p.trim()).filter((p) => p !== '')) {
		const hazard = readHazard(part);
		if (!hazard) {
			return bad(`${quote(part)} is not a known hazard; use ${HAZARD_FLAGS.join(', ')}, each optionally followed by “: note”, separated by “ | ”.`);
		}
		out.push(hazard);
	}
	return ok(out);
}

function readHazard(part: string): { flag: HazardFlag; note: string } | null {
	const lower = part.toLowerCase();
	let best: { flag: HazardFlag; length: number } | null = null;
	for (const flag of HAZARD_FLAGS) {
		for (const name of [flag, LABELS.hazard[flag].toLowerCase()]) {
			const rest = lower.slice(name.length).trimStart();
			if (lower.startsWith(name) && (rest === '' || rest.startsWith(':')) && name.length > (best?.length ?? 0)) {
				best = { flag, length: name.length };
			}
		}
	}
	if (!best) return null;
	return { flag: best.flag, note: part.slice(best.length).trim().replace(/^:/, '').trim() };
}

/** A calendar date in ISO form; spreadsheets' local forms (31/03/2026, 03/31/2026) are ambiguous. */
export function readDate(cell: string): Cell<string | null> {
	if (cell === '') return ok(null);
	const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(cell);
	const d = m ? new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]))) : null;
	if (!d || d.toISOString().slice(0, 10) !== cell) {
		return bad(`${quote(cell)} is not a date in the form YYYY-MM-DD, such as 2026-03-31.`);
	}
	return ok(cell);
}

/** A storage location by its code: exactly as written, or else in another letter case. */
export function readLocation(cell: string, locationsByCode: ReadonlyMap<string, string>): Cell<string | null> {
	if (cell === '') return ok(null);
	const exact = locationsByCode.get(cell);
	if (exact) return ok(exact);
	const matches = [...locationsByCode].filter(([code]) => code.toLowerCase() === cell.toLowerCase());
	if (matches.length === 1) return ok(matches[0]![1]);
	return bad(`No storage location has the code ${quote(cell)}; an administrator keeps the list of locations.`);
}

/** Free text, as it is (the record's schema trims it and checks its length). */
export const readText = (cell: string): Cell<string> => ok(cell);
