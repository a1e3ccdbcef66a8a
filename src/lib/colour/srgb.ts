/**
 * sRGB after IEC 61966-2-1:1999: the transfer function between encoded and linear-light values and
 * the matrix from linear RGB to CIE XYZ (D65, CIE 1931 2° observer). Written out rather than taken
 * from culori because culori derives its matrix and its white from the chromaticities to more
 * places and zeroes a* and b* of any grey; the project's reference (shared/reference/colour.json)
 * is the standard's own four-decimal matrix with the 95.047 / 100 / 108.883 white, and the numbers
 * here must be the ones that reference checks.
 */
import { apply3, type Matrix3 } from './matrix3.ts';
import { checkTriple, RGB_NAMES, type LinearRgb, type Rgb8, type Xyz } from './triple.ts';

/** Linear sRGB (0–1) to XYZ (0–1), IEC 61966-2-1:1999, to the four decimals the standard prints. */
export const SRGB_TO_XYZ: Matrix3 = [
	[0.4124, 0.3576, 0.1805],
	[0.2126, 0.7152, 0.0722],
	[0.0193, 0.1192, 0.9505],
];

/** The D65 white on the Y = 100 scale that L*a*b* is taken relative to (colour.json, white_D65_XYZ). */
export const D65_WHITE: Xyz = [95.047, 100, 108.883];

function finite(what: string, v: number): void {
	if (typeof v !== 'number' || !Number.isFinite(v)) throw new RangeError(`${what} must be a finite number (got ${String(v)}).`);
}

/** Encoded sRGB (0–1) to linear light: the IEC 61966-2-1 decoding, linear segment below 0.04045. */
export function srgbToLinear(v: number): number {
	finite('An encoded sRGB value', v);
	return v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4;
}

/** Linear light (0–1) to encoded sRGB: the inverse, linear segment below 0.0031308. */
export function linearToSrgb(l: number): number {
	finite('A linear-light value', l);
	return l <= 0.0031308 ? 12.92 * l : 1.055 * l ** (1 / 2.4) - 0.055;
}

/**
 * The 256 decoded 8-bit values. Region statistics decode every pixel, and a table lookup is
 * several times cheaper than a power per channel.
 */
export const SRGB8_TO_LINEAR: Float64Array = Float64Array.from({ length: 256 }, (_, i) => srgbToLinear(i / 255));

/** Linear RGB (0–1) to XYZ on the Y = 100 scale. */
export function linearRgbToXyz(rgb: LinearRgb): [number, number, number] {
	checkTriple('Linear RGB', rgb, RGB_NAMES, [0, 1]);
	const [x, y, z] = apply3(SRGB_TO_XYZ, rgb);
	return [100 * x, 100 * y, 100 * z];
}

/** 8-bit sRGB (0–255) to linear RGB (0–1). */
export function srgbToLinearRgb(rgb: Rgb8): [number, number, number] {
	checkTriple('sRGB', rgb, RGB_NAMES, [0, 255]);
	return [srgbToLinear(rgb[0] / 255), srgbToLinear(rgb[1] / 255), srgbToLinear(rgb[2] / 255)];
}

/** 8-bit sRGB (0–255) to XYZ on the Y = 100 scale, e.g. to turn a mean colour into a yellowness index. */
export const srgbToXyz = (rgb: Rgb8): [number, number, number] => linearRgbToXyz(srgbToLinearRgb(rgb));
