import Papa from 'papaparse';

/**
 * What every CSV download shares. Cells that a spreadsheet would run as a formula (=, +, -, @, tab,
 * CR at the start) get a leading apostrophe (OWASP, "CSV Injection"); the import removes exactly that
 * apostrophe again (lib/specimen/csvCells.ts, `undefuse`). The file starts with a byte-order mark so
 * spreadsheets read it as UTF-8, and lines end in CRLF (RFC 4180).
 */
export const defuse = (v: string): string => (/^[=+\-@\t\r]/.test(v) ? `'${v}` : v);

export function toCsvText(fields: readonly string[], rows: string[][]): string {
	return Papa.unparse({ fields: [...fields], data: rows }, { newline: '\r\n' });
}

/** A CSV attachment named `meniscus-<stem>-<today>.csv`. */
export function csvDownload(fields: readonly string[], rows: string[][], stem: string): Response {
	const day = new Date().toISOString().slice(0, 10);
	return new Response(`\uFEFF${toCsvText(fields, rows)}\r\n`, {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="meniscus-${stem}-${day}.csv"`,
		},
	});
}
