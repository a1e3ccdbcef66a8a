/**
 * CIE 1976 L*a*b* from XYZ (CIE 15:2004 §8.2.1), with the exact ratios ε = 216/24389 and
 * κ = 24389/27 rather than the rounded 0.008856 and 903.3, so the two branches of f meet without
 * a step near black.
 */
import { D65_WHITE, srgbToXyz } from './srgb.ts';
import { checkTriple, XYZ_NAMES, type Rgb8, type Xyz } from './triple.ts';

const EPSILON = 216 / 24389;
const KAPPA = 24389 / 27;

const f = (t: number): number => (t > EPSILON ? Math.cbrt(t) : (KAPPA * t + 16) / 116);

/** XYZ to L*a*b* relative to `white` (both on the same scale; default the D65 white, Y = 100). */
export function xyzToLab(xyz: Xyz, white: Xyz = D65_WHITE): [number, number, number] {
	checkTriple('XYZ', xyz, XYZ_NAMES);
	checkTriple('The reference white', white, XYZ_NAMES);
	if (!white.every((v) => v > 0)) throw new RangeError('The reference white must have X, Y and Z above 0.');
	const fx = f(xyz[0] / white[0]);
	const fy = f(xyz[1] / white[1]);
	const fz = f(xyz[2] / white[2]);
	return [116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz)];
}

/** 8-bit sRGB (0–255) to L*a*b* (D65, 2° observer). Throws a RangeError for NaN or values outside 0–255. */
export const srgbToLab = (rgb: Rgb8): [number, number, number] => xyzToLab(srgbToXyz(rgb));
