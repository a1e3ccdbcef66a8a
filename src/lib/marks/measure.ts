/**
 * Sizes of marks: pixels always, millimetres when the photo has a scale bar. The scale bar is a
 * line the user drew over a ruler in the photo and its known length, so one photo has one
 * millimetres-per-pixel figure; how far that figure holds across a jar is what MEASUREMENT_CAVEAT
 * tells the user.
 */
import { polygonArea, polylineLength } from './geometry.ts';
import type { Mark, MarkLayer } from './schema.ts';

/**
 * Shown beside every millimetre figure. Glass and fluid bend light, and a round jar magnifies
 * more near its middle than at its edges, so a scale taken on a ruler outside the jar does not
 * hold inside it, nor the same everywhere.
 */
export const MEASUREMENT_CAVEAT =
	'Sizes in millimetres are estimates. The curved glass and the fluid bend light, so a jar magnifies what is inside it, and by different amounts across its width. Unless the scale bar was photographed in the same plane as the specimen, treat these figures as approximate.';

const segmentLength = (from: readonly [number, number], to: readonly [number, number]): number => polylineLength([from, to]);

/**
 * Millimetres per photo pixel from the layer's scale bar; null when there is none, or when its two
 * ends coincide (a scale of zero pixels has no meaning, and dividing by it would give Infinity).
 */
export function mmPerPixel(layer: MarkLayer): number | null {
	const scale = layer.marks.find((m) => m.kind === 'scale');
	if (!scale) return null;
	const px = segmentLength(scale.from, scale.to);
	if (!(px > 0)) return null;
	return scale.lengthMm / px;
}

/** Area in px² of an outline or a box; null for marks that have no area to report. */
export function markArea(mark: Mark): number | null {
	switch (mark.kind) {
		case 'outline':
			return polygonArea(mark.points);
		case 'box':
			return mark.w * mark.h;
		default:
			return null;
	}
}

/** Length in px of a line, the scale bar or a level line; null for marks that are not lines. */
export function markLength(mark: Mark): number | null {
	switch (mark.kind) {
		case 'path':
			return polylineLength(mark.points);
		case 'scale':
		case 'level':
			return segmentLength(mark.from, mark.to);
		default:
			return null;
	}
}

export interface Measured {
	areaPx2: number | null;
	areaMm2: number | null;
	lengthPx: number | null;
	lengthMm: number | null;
}

/** A mark's size in pixels and, when the layer has a usable scale bar, in millimetres. */
export function measured(mark: Mark, layer: MarkLayer): Measured {
	const k = mmPerPixel(layer);
	const areaPx2 = markArea(mark);
	const lengthPx = markLength(mark);
	return {
		areaPx2,
		// Areas scale with the square of the linear scale.
		areaMm2: areaPx2 === null || k === null ? null : areaPx2 * k * k,
		// The scale bar measures to its own stated length, not to a value rounded through k.
		lengthMm: lengthPx === null || k === null ? null : mark.kind === 'scale' ? mark.lengthMm : lengthPx * k,
		lengthPx,
	};
}

/**
 * Three significant figures: a photograph through a jar is not better than about one per cent,
 * so more digits would claim precision the method does not have (common practice, no published
 * source). Grouped thousands, as the rest of the UI writes numbers.
 */
const threeFigures = new Intl.NumberFormat('en-GB', { maximumSignificantDigits: 3 });

function format(n: number, unit: string): string {
	if (!Number.isFinite(n)) return '—';
	// Normalise −0, which Intl would print as "-0".
	return `${threeFigures.format(n === 0 ? 0 : n)} ${unit}`;
}

/** A length for display: "4.57 mm", "1,250 mm". */
export const formatMm = (n: number): string => format(n, 'mm');

/** An area for display: "50 mm²", "12,300 mm²". */
export const formatMm2 = (n: number): string => format(n, 'mm²');
