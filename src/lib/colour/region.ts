/**
 * Mean colour of the pixels inside a mark, for measuring fluid colour. Marks are stored in pixels
 * of the full-resolution photo; the pixels averaged may be a downscaled display copy, so the
 * outline is scaled by `scale` (display px per photo px) first. A pixel counts when its centre is
 * inside the outline (even-odd rule, the rule marks/geometry.ts pointInPolygon uses), found a row
 * at a time by scanline rather than by testing every pixel of the bounding box.
 *
 * The mean is taken in linear light: averaging gamma-encoded values would weight dark pixels too
 * much and give a colour that no mixture of the pixels' light has.
 */
import type { XY } from '../marks/geometry.ts';
import { SRGB8_TO_LINEAR } from './srgb.ts';
import type { LinearRgb } from './triple.ts';

export interface RegionMean {
	/** Mean linear-light RGB (0–1) of the counted pixels; null when none were counted. */
	linearRgb: LinearRgb | null;
	/** Pixels averaged. */
	count: number;
	/** Pixels inside the region left out as near-clipped (see isNearClipped). */
	skipped: number;
}

/** A rectangle in photo pixels: left, top, width, height. */
export interface PhotoBox {
	x: number;
	y: number;
	w: number;
	h: number;
}

/**
 * A pixel at or near the ends of the 8-bit range carries no reliable colour: a channel at 250 or
 * more may have been clipped by the sensor or the JPEG encoder, and one whose channels are all 5 or
 * less is mostly noise. Thresholds are common practice, no published source.
 */
export const CLIP_HIGH = 250;
export const CLIP_LOW = 5;

function checkImage(pixels: ArrayLike<number>, width: number, height: number, channels: number): void {
	if (!Number.isInteger(width) || width <= 0 || !Number.isInteger(height) || height <= 0) {
		throw new RangeError(`The image size must be positive whole numbers of pixels (got ${width} × ${height}).`);
	}
	if (channels !== 3 && channels !== 4) throw new RangeError(`The image must have 3 (RGB) or 4 (RGBA) channels (got ${channels}).`);
	if (pixels.length < width * height * channels) {
		const need = width * height * channels;
		throw new RangeError(`The pixel buffer holds ${pixels.length} values; ${width} × ${height} × ${channels} needs ${need}.`);
	}
}

function scaledPolygon(polygon: readonly XY[], scale: number): XY[] {
	if (!Number.isFinite(scale) || scale <= 0) {
		throw new RangeError(`The scale must be a positive number of display pixels per photo pixel (got ${scale}).`);
	}
	return polygon.map((p, i) => {
		if (!Number.isFinite(p[0]) || !Number.isFinite(p[1])) throw new RangeError(`Point ${i + 1} of the outline is not two finite numbers.`);
		return [p[0] * scale, p[1] * scale] as const;
	});
}

/**
 * Where the row of pixel centres at height y crosses the outline, sorted. Each edge is half-open in
 * y (one end in, the other out) so a vertex exactly on the row is counted once.
 */
function crossings(polygon: readonly XY[], y: number): number[] {
	const xs: number[] = [];
	for (let i = 0, j = polygon.length - 1; i < polygon.length; j = i++) {
		const [ax, ay] = polygon[j]!;
		const [bx, by] = polygon[i]!;
		if (ay > y !== by > y) xs.push(ax + ((y - ay) * (bx - ax)) / (by - ay));
	}
	return xs.sort((a, b) => a - b);
}

/**
 * Mean linear RGB of the pixels whose centres lie inside `polygon` (photo px), skipping
 * near-clipped ones. An outline with fewer than three points, or wholly outside the image,
 * counts nothing: count 0 and linearRgb null, never NaN.
 */
export function meanColourInPolygon(
	pixels: Uint8Array | Uint8ClampedArray,
	width: number,
	height: number,
	channels: number,
	polygon: readonly XY[],
	scale = 1,
): RegionMean {
	checkImage(pixels, width, height, channels);
	const poly = scaledPolygon(polygon, scale);
	let r = 0;
	let g = 0;
	let b = 0;
	let count = 0;
	let skipped = 0;
	if (poly.length >= 3) {
		// Rows whose centre (row + 0.5) can lie inside: the outline's extent, clipped to the image.
		const top = poly.reduce((m, p) => Math.min(m, p[1]), Infinity);
		const bottom = poly.reduce((m, p) => Math.max(m, p[1]), -Infinity);
		const firstRow = Math.max(0, Math.ceil(top - 0.5));
		const endRow = Math.min(height, Math.ceil(bottom - 0.5));
		for (let row = firstRow; row < endRow; row++) {
			const xs = crossings(poly, row + 0.5);
			for (let k = 0; k + 1 < xs.length; k += 2) {
				// Centre (col + 0.5) inside when xs[k] ≤ col + 0.5 < xs[k + 1], as pointInPolygon decides it.
				const from = Math.max(0, Math.ceil(xs[k]! - 0.5));
				const to = Math.min(width, Math.ceil(xs[k + 1]! - 0.5));
				for (let col = from, at = (row * width + from) * channels; col < to; col++, at += channels) {
					const pr = pixels[at]!;
					const pg = pixels[at + 1]!;
					const pb = pixels[at + 2]!;
					if (isNearClipped(pr, pg, pb)) {
						skipped++;
						continue;
					}
					r += SRGB8_TO_LINEAR[pr]!;
					g += SRGB8_TO_LINEAR[pg]!;
					b += SRGB8_TO_LINEAR[pb]!;
					count++;
				}
			}
		}
	}
	return { linearRgb: count > 0 ? [r / count, g / count, b / count] : null, count, skipped };
}

/** As meanColourInPolygon, for a rectangle in photo px (the grey reference is usually a box). */
export function meanColourInBox(
	pixels: Uint8Array | Uint8ClampedArray,
	width: number,
	height: number,
	channels: number,
	box: PhotoBox,
	scale = 1,
): RegionMean {
	const { x, y, w, h } = box;
	if (![x, y, w, h].every(Number.isFinite) || w < 0 || h < 0) {
		throw new RangeError('The box must be four finite numbers (x, y, width, height) with width and height 0 or more.');
	}
	return meanColourInPolygon(pixels, width, height, channels, [[x, y], [x + w, y], [x + w, y + h], [x, y + h]], scale);
}

/** True for a pixel whose colour cannot be trusted (see CLIP_HIGH and CLIP_LOW). */
export function isNearClipped(r: number, g: number, b: number): boolean {
	return r >= CLIP_HIGH || g >= CLIP_HIGH || b >= CLIP_HIGH || (r <= CLIP_LOW && g <= CLIP_LOW && b <= CLIP_LOW);
}
