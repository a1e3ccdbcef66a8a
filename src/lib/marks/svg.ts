/**
 * A mark layer as an SVG the size of a photo's display copy, drawn the way the canvas draws it
 * (drawMarks.ts): the part's colour over a black casing, line weight and dash by severity, a white
 * halo on severe marks, the part's letter code beside each damage mark. Measurement marks are white
 * on the casing with their own dash and code. Pure: the server composites the result with sharp.
 */
import { CASING, HALO, MEASURE_STYLE, PART_STYLE, SEVERITY_STYLE } from './palette.ts';
import type { Mark, MarkLayer, Point } from './schema.ts';

export interface SvgSize {
	/** The photograph's own pixel size: mark coordinates are in these pixels. */
	photo: { width: number; height: number };
	/** The size of the image the SVG is laid over. */
	target: { width: number; height: number };
}

const XML_ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&apos;' };
export const escapeXml = (s: string): string => s.replace(/[&<>"']/g, (c) => XML_ESCAPES[c]!);

const num = (n: number) => (Math.round(n * 100) / 100).toString();

interface Look {
	colour: string;
	width: number;
	dash: number[];
	halo: boolean;
	code: string;
}

function lookOf(m: Mark): Look {
	if ('part' in m) {
		const s = SEVERITY_STYLE[m.severity];
		return { colour: PART_STYLE[m.part].colour, width: s.strokeWidth, dash: s.dash, halo: s.halo, code: PART_STYLE[m.part].code };
	}
	const s = MEASURE_STYLE[m.kind];
	return { colour: s.colour, width: s.strokeWidth, dash: s.dash, halo: false, code: m.kind === 'control' ? `#${m.n}` : s.code };
}

/** The mark's geometry in target pixels: a path's d attribute and the point its code is written at. */
function geometry(m: Mark, p: (pt: Point) => [number, number]): { d: string; at: [number, number] } {
	const line = (pts: Point[], close: boolean) => {
		const s = pts.map(p);
		return { d: s.map(([x, y], i) => `${i ? 'L' : 'M'}${num(x)} ${num(y)}`).join(' ') + (close ? ' Z' : ''), at: s[0]! };
	};
	const rect = (x: number, y: number, w: number, h: number) => line([[x, y], [x + w, y], [x + w, y + h], [x, y + h]], true);
	switch (m.kind) {
		case 'outline':
			return line(m.points, true);
		case 'path':
			return line(m.points, false);
		case 'box':
		case 'grey':
			return rect(m.x, m.y, m.w, m.h);
		case 'scale':
		case 'level':
			return line([m.from, m.to], false);
		case 'pin':
		case 'control': {
			// A ring of 8 target px, the size the canvas draws a pin at.
			const [x, y] = p(m.at);
			const r = 8;
			return { d: `M${num(x - r)} ${num(y)} A${r} ${r} 0 1 0 ${num(x + r)} ${num(y)} A${r} ${r} 0 1 0 ${num(x - r)} ${num(y)} Z`, at: [x, y] };
		}
	}
}

function stroke(d: string, colour: string, width: number, dash: number[]): string {
	const dashAttr = dash.length ? ` stroke-dasharray="${dash.join(' ')}"` : '';
	return `<path d="${d}" fill="none" stroke="${colour}" stroke-width="${num(width)}" stroke-linejoin="round" stroke-linecap="round"${dashAttr}/>`;
}

/** One `<g>` per mark, in layer order, with the mark's id (escaped) as its data-mark attribute. */
export function marksSvg(layer: Pick<MarkLayer, 'marks'>, size: SvgSize): string {
	const kx = size.target.width / size.photo.width;
	const ky = size.target.height / size.photo.height;
	const p = (pt: Point): [number, number] => [pt[0] * kx, pt[1] * ky];
	// Lines scale a little with the copy so they read in print, never below the canvas's own widths.
	const w = Math.max(1, size.target.width / 1000);
	const groups = layer.marks.map((m) => {
		const look = lookOf(m);
		const { d, at } = geometry(m, p);
		const width = look.width * w;
		const dash = look.dash.map((x) => x * w);
		const parts = [
			look.halo ? stroke(d, HALO.colour, width + HALO.width * w, dash) : '',
			stroke(d, CASING.colour, width + CASING.width * w, dash),
			stroke(d, look.colour, width, dash),
		];
		const fs = num(12 * w);
		const label = `<text x="${num(at[0] + 6 * w)}" y="${num(at[1] - 6 * w)}" font-family="sans-serif" font-weight="bold" font-size="${fs}" fill="${look.colour}" stroke="${CASING.colour}" stroke-width="${num(3 * w)}" paint-order="stroke">${escapeXml(look.code)}</text>`;
		return `<g data-mark="${escapeXml(m.id)}">${parts.join('')}${label}</g>`;
	});
	const { width, height } = size.target;
	return `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}">${groups.join('')}</svg>`;
}
