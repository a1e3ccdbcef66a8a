import type { Mark } from '../../lib/marks/schema.ts';
import type { DraftMark } from '../../lib/marks/tools/effects.ts';
import { LEVEL_LABEL, MEASURE_STYLE, PART_STYLE, SEVERITY_STYLE } from '../../lib/marks/palette.ts';

/**
 * How a mark looks (palette.ts: colour by part, weight and dash by severity, its code label) and
 * its outline as flat points: shared by the Konva shapes (MarkShape), the one-shape layer drawing
 * (drawMarks.ts) and the worker that draws bitmaps for moving views. No React, no DOM.
 */
export type Drawable = Mark | (DraftMark & { id?: string });

export interface Style {
	colour: string;
	width: number;
	dash: number[];
	halo: boolean;
	code: string;
}

export function styleOf(m: Drawable): Style {
	if ('part' in m && m.part) {
		const s = SEVERITY_STYLE[m.severity];
		return { colour: PART_STYLE[m.part].colour, width: s.strokeWidth, dash: s.dash, halo: s.halo, code: PART_STYLE[m.part].code };
	}
	const k = m.kind as keyof typeof MEASURE_STYLE;
	const s = MEASURE_STYLE[k] ?? MEASURE_STYLE.level;
	const code = m.kind === 'control' && 'n' in m ? `#${m.n}` : m.kind === 'level' && 'level' in m && m.level ? LEVEL_LABEL[m.level] : s.code;
	return { colour: s.colour, width: s.strokeWidth, dash: s.dash, halo: false, code };
}

/** Flat [x0, y0, x1, y1, …] for Konva, and where the code label goes. */
export function geometry(m: Drawable): { points: number[]; closed: boolean; anchor: [number, number]; pin?: [number, number] } {
	switch (m.kind) {
		case 'outline':
			return { points: m.points.flat(), closed: true, anchor: m.points[0]! };
		case 'path':
			return { points: m.points.flat(), closed: false, anchor: m.points[m.points.length - 1]! };
		case 'box':
		case 'grey':
			return { points: [m.x, m.y, m.x + m.w, m.y, m.x + m.w, m.y + m.h, m.x, m.y + m.h], closed: true, anchor: [m.x, m.y] };
		case 'scale':
		case 'level':
			return { points: [...m.from, ...m.to], closed: false, anchor: m.to };
		case 'pin':
		case 'control':
			return { points: [], closed: false, anchor: m.at, pin: m.at };
	}
}

