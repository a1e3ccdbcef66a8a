/**
 * How marks look: one colour and one letter code per part, one line weight per severity, and
 * separate looks for the measurement marks, all in one place so the canvas, the legend and any
 * export agree.
 *
 * Colours are the seven chromatic colours of the Okabe–Ito palette: M. Okabe and K. Ito, "Color
 * Universal Design (CUD): How to make figures and presentations that are friendly to Colorblind
 * people" (2008), https://jfly.uni-koeln.de/color/ (formerly jfly.iam.u-tokyo.ac.jp/color/). It was
 * chosen to stay distinguishable under the common forms of colour-vision deficiency. The palette's
 * eighth colour, black, is kept for the casing below.
 *
 * Colour is never the only cue: each part's mark carries its letter code, and severity is carried
 * by line width, dash and halo, never by colour.
 *
 * Contrast. A photograph can be any colour behind a mark. Against mid-grey (#808080) none of the
 * seven colours reaches 3:1 (WCAG 2.x non-text contrast; yellow comes closest at 2.99:1), and no
 * mid-tone colour can. So every stroke is drawn over a black CASING a little wider than itself:
 * black stands 5.3:1 against mid-grey and 21:1 against white, and every part colour stands at
 * least 4:1 against black, so on a light or mid-tone photo the casing carries the mark, and on a
 * dark one the colour does. Severe marks add a white HALO outside the casing, which reads as a
 * double line and carries them on dark photos too. tests/unit/marks/palette.test.ts checks these
 * figures.
 */
import { CHECK_LABELS, PARTS, type Part } from '../check/vocabulary.ts';
import type { Level, Severity } from './schema.ts';

export interface PartStyle {
	/** Stroke colour, sRGB hex. */
	colour: string;
	/** Drawn beside the mark, so the part is legible without colour. */
	code: string;
	label: string;
}

/** Okabe–Ito colours by name, so the assignment below reads as a choice, not a hex dump. */
const OKABE_ITO = {
	orange: '#E69F00',
	skyBlue: '#56B4E9',
	bluishGreen: '#009E73',
	yellow: '#F0E442',
	blue: '#0072B2',
	vermillion: '#D55E00',
	reddishPurple: '#CC79A7',
	black: '#000000',
} as const;

/**
 * Parts that touch in a photo (lid and seal; fluid and specimen) get colours far apart in hue;
 * the closest pair in the palette (sky blue and blue, ΔE*ab ≈ 26) goes to container and fluid,
 * which differ strongly in lightness, which survives colour-vision deficiency.
 */
export const PART_STYLE: Record<Part, PartStyle> = {
	container: { colour: OKABE_ITO.skyBlue, code: 'C', label: CHECK_LABELS.part.container },
	lid: { colour: OKABE_ITO.orange, code: 'L', label: CHECK_LABELS.part.lid },
	seal: { colour: OKABE_ITO.reddishPurple, code: 'S', label: CHECK_LABELS.part.seal },
	fluid: { colour: OKABE_ITO.blue, code: 'F', label: CHECK_LABELS.part.fluid },
	specimen: { colour: OKABE_ITO.vermillion, code: 'Sp', label: CHECK_LABELS.part.specimen },
	mount: { colour: OKABE_ITO.bluishGreen, code: 'M', label: CHECK_LABELS.part.mount },
	label: { colour: OKABE_ITO.yellow, code: 'Lb', label: CHECK_LABELS.part.label },
};

/**
 * Drawn under every stroke, the same dash as the stroke, `width` px wider in total, so the mark
 * keeps its edge on any photo (see the module comment).
 */
export const CASING = { colour: OKABE_ITO.black, width: 2 } as const;
/** Drawn under the casing of severe marks only, `width` px wider than the stroke in total. */
export const HALO = { colour: '#FFFFFF', width: 6 } as const;

export interface SeverityStyle {
	/** Stroke width in screen px; the canvas keeps it constant at any zoom. */
	strokeWidth: number;
	/** Canvas dash pattern in screen px; empty for a solid line. */
	dash: number[];
	/** Draw HALO as well as CASING. */
	halo: boolean;
	label: string;
}

/** Severity by weight alone: thin dashed, medium solid, thick solid with a halo. */
export const SEVERITY_STYLE: Record<Severity, SeverityStyle> = {
	1: { strokeWidth: 1.5, dash: [6, 4], halo: false, label: 'Minor' },
	2: { strokeWidth: 3, dash: [], halo: false, label: 'Moderate' },
	3: { strokeWidth: 5, dash: [], halo: true, label: 'Severe' },
};

export type MeasureKind = 'scale' | 'grey' | 'level' | 'control';

export interface MeasureStyle {
	colour: string;
	code: string;
	strokeWidth: number;
	dash: number[];
	label: string;
}

/**
 * Measurement marks are white on the black casing: no part uses white, and a dash pattern of
 * their own tells them from damage even in greyscale. The scale bar is solid with end ticks
 * (`tick`, px), like the ruler it is drawn over.
 */
export const MEASURE_STYLE: Record<MeasureKind, MeasureStyle> & { scale: { tick: number } } = {
	scale: { colour: '#FFFFFF', code: 'Sc', strokeWidth: 2, dash: [], label: 'Scale bar', tick: 10 },
	grey: { colour: '#FFFFFF', code: 'G', strokeWidth: 2, dash: [2, 3], label: 'Grey reference' },
	level: { colour: '#FFFFFF', code: 'Lv', strokeWidth: 2, dash: [12, 4, 2, 4], label: 'Level line' },
	control: { colour: '#FFFFFF', code: '#', strokeWidth: 2, dash: [], label: 'Control point' },
};

/** The name each level line is drawn with. */
export const LEVEL_LABEL: Record<Level, string> = {
	'fluid-line': 'Fluid line',
	'specimen-top': 'Top of specimen',
	'inner-base': 'Inner base',
};

export type LegendEntry =
	| { group: 'part'; key: Part; label: string; code: string; colour: string }
	| { group: 'severity'; key: Severity; label: string; strokeWidth: number; dash: number[]; halo: boolean }
	| { group: 'measure'; key: MeasureKind; label: string; code: string; colour: string; strokeWidth: number; dash: number[] };

/**
 * The on-screen legend, in reading order: parts (swatch and code), severities (line samples, which
 * carry no colour: the legend draws them in a neutral one so they are not read as a part), then
 * measurement marks. Each call returns
 * fresh arrays, so a caller may not alter the styles through it.
 */
export function legendEntries(): LegendEntry[] {
	return [
		...PARTS.map((key): LegendEntry => ({ group: 'part', key, ...PART_STYLE[key] })),
		...([1, 2, 3] as const).map((key): LegendEntry => ({ group: 'severity', key, ...SEVERITY_STYLE[key], dash: [...SEVERITY_STYLE[key].dash] })),
		...(['scale', 'grey', 'level', 'control'] as const).map((key): LegendEntry => {
			const { colour, code, strokeWidth, dash, label } = MEASURE_STYLE[key];
			return { group: 'measure', key, colour, code, strokeWidth, label, dash: [...dash] };
		}),
	];
}
