import type { Headline } from './report.ts';

/**
 * The report's chart: every headline ratio as a horizontal bar on a logarithmic axis around 1×
 * (the same-run baseline), with the target marked where the issue set one. Plain SVG, no
 * dependency; text in the chart repeats the numbers so it reads without colour.
 */
const esc = (s: string) => s.replace(/[&<>"]/g, (c) => `&#${c.charCodeAt(0)};`);

export function headlineChart(rows: readonly Headline[]): string {
	// Room for the longest label (about 6.5 px a character at 12 px), then the bars.
	const left = 20 + Math.ceil(Math.max(...rows.map((r) => r.label.length)) * 6.5);
	const width = left + 520;
	const right = 120;
	const rowH = 26;
	const top = 40;
	const height = top + rows.length * rowH + 40;
	const values = rows.flatMap((r) => [r.ratio, r.target?.value ?? r.ratio, 1]);
	const lo = Math.log10(Math.min(...values) / 1.5);
	const hi = Math.log10(Math.max(...values) * 1.5);
	const x = (v: number) => left + ((Math.log10(v) - lo) / (hi - lo)) * (width - left - right);
	const ticks = [0.01, 0.02, 0.05, 0.1, 0.2, 0.5, 1, 2, 5, 10, 20, 50, 100, 200, 500, 1000].filter((t) => Math.log10(t) >= lo && Math.log10(t) <= hi);
	const out: string[] = [
		`<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" font-family="sans-serif" font-size="12">`,
		`<rect width="100%" height="100%" fill="#ffffff"/>`,
		`<text x="10" y="20" font-size="13" font-weight="bold">Each figure ÷ its baseline measured in the same run (log scale; 1× = baseline)</text>`,
	];
	for (const t of ticks) out.push(`<line x1="${x(t)}" y1="${top - 6}" x2="${x(t)}" y2="${height - 30}" stroke="${t === 1 ? '#324347' : '#e2e8e9'}" stroke-width="${t === 1 ? 1.5 : 1}"/>`, `<text x="${x(t)}" y="${height - 14}" text-anchor="middle" fill="#52696e">${t}×</text>`);
	rows.forEach((r, i) => {
		const y = top + i * rowH;
		const met = r.target ? (r.target.better === 'lower' ? r.ratio <= r.target.value : r.ratio >= r.target.value) : null;
		const fill = met === null ? '#469c97' : met ? '#236763' : '#b3261e';
		const [a, b] = [x(Math.min(1, r.ratio)), x(Math.max(1, r.ratio))];
		out.push(`<text x="${left - 8}" y="${y + 16}" text-anchor="end">${esc(r.label)}</text>`);
		out.push(`<rect x="${a}" y="${y + 5}" width="${Math.max(1, b - a)}" height="${rowH - 10}" fill="${fill}"/>`);
		if (r.target) out.push(`<line x1="${x(r.target.value)}" y1="${y + 2}" x2="${x(r.target.value)}" y2="${y + rowH - 2}" stroke="#1a1a1a" stroke-width="2" stroke-dasharray="3,2"/>`);
		const verdict = met === null ? '' : met ? ` met (target ${r.target!.better === 'lower' ? '≤' : '≥'} ${r.target!.value}×)` : ` missed (target ${r.target!.better === 'lower' ? '≤' : '≥'} ${r.target!.value}×)`;
		out.push(`<text x="${Math.max(a, b) + 6}" y="${y + 16}">${r.ratio.toFixed(2)}×${esc(verdict)}</text>`);
	});
	out.push('</svg>');
	return out.join('\n');
}
