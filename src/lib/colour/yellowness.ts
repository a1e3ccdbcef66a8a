/**
 * Yellowness index after ASTM E313 (Standard Practice for Calculating Yellowness and Whiteness
 * Indices from Instrumentally Measured Color Coordinates): YI = 100 (Cx·X − Cz·Z) / Y, with XYZ on
 * the Y = 100 scale. The coefficients depend on the illuminant and the observer the XYZ were
 * computed for, and are chosen so that the perfect diffuser under that illuminant has YI = 0;
 * positive is yellower, negative bluer.
 *
 * XYZ derived from sRGB are for D65 and the CIE 1931 2° observer, so 'D65/2' is the matching
 * choice for photographs. The 10° sets are for instrument data taken with that observer: applied
 * to 2° data they shift every value (a neutral grey reads about −1.5 with D65/10).
 */
import { checkTriple, XYZ_NAMES, type Xyz } from './triple.ts';

export type E313Illuminant = 'D65/10' | 'D65/2' | 'C/2' | 'C/10';

/**
 * Cx and Cz per illuminant / observer, from the table in ASTM E313. The four pairs were written
 * down from memory and agree with shared/reference/colour.json and with colour-science's
 * YELLOWNESS_COEFFICIENTS_ASTME313 (colour/colorimetry/yellowness.py).
 */
export const E313_COEFFICIENTS: Readonly<Record<E313Illuminant, { cx: number; cz: number }>> = {
	'C/2': { cx: 1.2769, cz: 1.0592 },
	'D65/2': { cx: 1.2985, cz: 1.1335 },
	'C/10': { cx: 1.2871, cz: 1.0781 },
	'D65/10': { cx: 1.3013, cz: 1.1498 },
};

/** ASTM E313 YI of `xyz` (Y = 100 scale) for the illuminant / observer the XYZ belong to. */
export function yellownessIndexE313(xyz: Xyz, illuminant: E313Illuminant = 'D65/2'): number {
	checkTriple('XYZ', xyz, XYZ_NAMES);
	const c = Object.hasOwn(E313_COEFFICIENTS, illuminant) ? E313_COEFFICIENTS[illuminant] : undefined;
	if (!c) {
		const known = Object.keys(E313_COEFFICIENTS).join(', ');
		throw new RangeError(`The illuminant must be one of ${known} (got ${String(illuminant)}).`);
	}
	const [x, y, z] = xyz;
	// Black (or a region so dark it rounds to Y = 0) has no yellowness: the index divides by Y.
	if (!(y > 0)) throw new RangeError(`The yellowness index needs Y above 0 (got ${y}).`);
	return (100 * (c.cx * x - c.cz * z)) / y;
}
