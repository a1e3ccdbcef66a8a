import fs from 'node:fs';

/**
 * What every benchmark shares: medians, ratios, Markdown tables, and the Markdown part it hands to
 * bench/run.ts (which joins the parts into bench/REPORT.md). A benchmark run on its own just
 * prints; run.ts sets BENCH_REPORT_PART to collect.
 */

export function median(xs: readonly number[]): number {
	if (xs.length === 0) return Number.NaN;
	const s = [...xs].sort((a, b) => a - b);
	const mid = Math.floor(s.length / 2);
	return s.length % 2 === 1 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2;
}

/** "0.42×": a ratio to a baseline, the way every figure here is shown. */
export const ratio = (value: number, baseline: number): string => (Number.isFinite(value / baseline) ? `${(value / baseline).toFixed(2)}×` : 'n/a');

export const ms = (v: number): string => (Number.isFinite(v) ? (v >= 100 ? v.toFixed(0) : v.toFixed(1)) : 'n/a');
export const seconds = (v: number): string => (Number.isFinite(v) ? (v / 1000).toFixed(2) : 'n/a');
export const mb = (kb: number | null): string => (kb === null ? 'n/a' : (kb / 1024).toFixed(0));

/** A Markdown table from a header row and body rows (strings as given). */
export function table(head: readonly string[], rows: readonly (readonly string[])[]): string {
	const line = (cells: readonly string[]) => `| ${cells.join(' | ')} |`;
	return [line(head), line(head.map(() => '---')), ...rows.map(line)].join('\n');
}

/** Hands a Markdown section to run.ts (if it is collecting) and prints it, unless already printed. */
export function emitPart(markdown: string, { print = true }: { print?: boolean } = {}): void {
	const part = process.env.BENCH_REPORT_PART;
	if (part) fs.appendFileSync(part, `${markdown.trim()}\n\n`);
	if (print) console.log(`\n${markdown.trim()}\n`);
}

/** One headline figure for the report's chart: a ratio to its same-run baseline, and its target if any. */
export interface Headline {
	label: string;
	ratio: number;
	/** The target ratio, and which side of it is good. */
	target?: { value: number; better: 'lower' | 'higher' };
}

/** Hands a headline ratio to run.ts (a JSON line beside the Markdown part), which charts them all. */
export function emitHeadline(h: Headline): void {
	const part = process.env.BENCH_REPORT_PART;
	if (part && Number.isFinite(h.ratio)) fs.appendFileSync(`${part}.headlines.jsonl`, `${JSON.stringify(h)}\n`);
}
