/**
 * The three-number colours the colour module passes around, and the checks at its edges. Each
 * kind is its own alias so a signature says which space a triple is in; the compiler cannot tell
 * them apart, so the names and the doc comments carry that.
 */

export type Triple = readonly [number, number, number];

/** Gamma-encoded sRGB, 0–255 per channel (fractions allowed: a region's mean need not be whole). */
export type Rgb8 = Triple;
/** Linear-light sRGB, 0–1 per channel: what light adds up in, so what region means average. */
export type LinearRgb = Triple;
/** CIE 1931 XYZ on the Y = 100 scale (a perfect white has Y = 100). */
export type Xyz = Triple;
/** CIE 1976 L*a*b* as [L*, a*, b*]. */
export type Lab = Triple;

export const RGB_NAMES = ['red', 'green', 'blue'] as const;
export const XYZ_NAMES = ['X', 'Y', 'Z'] as const;
export const LAB_NAMES = ['L*', 'a*', 'b*'] as const;

type Names = readonly [string, string, string];

/**
 * Throws a RangeError that names the value and the channel unless `t` is three finite numbers,
 * each within `range` when one is given. NaN would otherwise pass through every formula here and
 * come out as a colour.
 */
export function checkTriple(what: string, t: unknown, names: Names, range?: readonly [number, number]): asserts t is Triple {
	if (!Array.isArray(t) || t.length !== 3) throw new RangeError(`${what} must be three numbers (${names.join(', ')}).`);
	t.forEach((v: unknown, i) => {
		const name = `${what} ${names[i]}`;
		if (typeof v !== 'number' || !Number.isFinite(v)) throw new RangeError(`${name} must be a finite number (got ${String(v)}).`);
		if (range && (v < range[0] || v > range[1])) throw new RangeError(`${name} must be from ${range[0]} to ${range[1]} (got ${v}).`);
	});
}
