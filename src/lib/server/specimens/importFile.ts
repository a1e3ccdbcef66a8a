import Papa from 'papaparse';
import { MAX_IMPORT_BYTES, MAX_IMPORT_ROWS, type CsvRow } from '../../specimen/csvImport.ts';

/**
 * An uploaded CSV file read into its header and rows, or refused as a whole when it cannot be an
 * import at all (too large, no header, column names repeated, not UTF-8). Problems of one row (a
 * quote that does not close, cells beyond the header) stay with that row, so the preview can show
 * them where they are.
 */
export class ImportError extends Error {
	constructor(
		readonly status: 400 | 409 | 413,
		message: string,
	) {
		super(message);
	}
}

export interface CsvFileRow {
	/** As a spreadsheet numbers it: the header is row 1. */
	row: number;
	cells: CsvRow;
	problems: string[];
}

export interface CsvFile {
	headers: string[];
	rows: CsvFileRow[];
}

const fmt = (n: number) => n.toLocaleString('en-GB');

export function readCsvFile(text: string): CsvFile {
	if (Buffer.byteLength(text, 'utf8') > MAX_IMPORT_BYTES) {
		throw new ImportError(413, `The file is larger than ${fmt(MAX_IMPORT_BYTES / 1024 / 1024)} MB; split it into smaller files.`);
	}
	// A byte that was not UTF-8 arrives as U+FFFD; importing it would replace letters with “�”.
	if (text.includes('\uFFFD')) {
		throw new ImportError(400, 'The file is not UTF-8 text; save it from the spreadsheet as “CSV UTF-8” and choose it again.');
	}
	const body = text.replace(/^\uFEFF/, '');
	const parsed = Papa.parse<string[]>(body, { delimiter: delimiterOf(body) });
	const [first, ...records] = parsed.data;
	const headers = readHeaders(first ?? []);
	const quoteRows = new Set(parsed.errors.filter((e) => e.type === 'Quotes' && e.row !== undefined).map((e) => e.row!));
	const rows: CsvFileRow[] = [];
	records.forEach((cells, i) => {
		if (cells.every((c) => c.trim() === '')) return;
		const problems: string[] = [];
		if (quoteRows.has(i + 1)) problems.push('A quoted cell in this row is not closed; check the quotation marks.');
		const extra = cells.slice(headers.length).filter((c) => c.trim() !== '').length;
		if (extra) problems.push(`This row has ${extra} filled cell(s) beyond the ${headers.length} named columns.`);
		rows.push({ row: i + 2, cells: Object.fromEntries(headers.map((h, j) => [h, cells[j] ?? ''])), problems });
	});
	if (rows.length === 0) throw new ImportError(400, 'The file has no rows under its header row.');
	if (rows.length > MAX_IMPORT_ROWS) {
		throw new ImportError(413, `The file has ${fmt(rows.length)} rows; import at most ${fmt(MAX_IMPORT_ROWS)} at a time.`);
	}
	return { headers, rows };
}

/**
 * The cell separator, from the first rows. Semicolons and tabs too: spreadsheets that write a
 * decimal comma separate cells with one of them. Blank lines are skipped for the guess only (they
 * would make every separator look inconsistent); the real parse keeps them so row numbers stay true.
 */
function delimiterOf(text: string): string {
	return Papa.parse<string[]>(text, { preview: 20, skipEmptyLines: true, delimitersToGuess: [',', ';', '\t'] }).meta.delimiter;
}

/** Column names, trimmed; an unnamed column is called by its position, a repeated name is refused. */
function readHeaders(cells: string[]): string[] {
	if (cells.every((c) => c.trim() === '')) {
		throw new ImportError(400, 'The file has no header row: its first row must name the columns, such as object_number and title.');
	}
	const headers = cells.map((c, i) => c.trim() || `Column ${i + 1}`);
	const seen = new Map<string, number>();
	headers.forEach((h, i) => {
		const before = seen.get(h);
		if (before !== undefined) {
			throw new ImportError(400, `Columns ${before + 1} and ${i + 1} are both named “${h}”; give each column its own name.`);
		}
		seen.set(h, i);
	});
	return headers;
}
