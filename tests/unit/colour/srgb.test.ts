import { converter } from 'culori';
import { describe, expect, it } from 'vitest';
import {
	D65_WHITE,
	linearRgbToXyz,
	linearToSrgb,
	SRGB_TO_XYZ,
	srgbToLab,
	srgbToLinear,
	srgbToXyz,
	xyzToLab,
} from '../../../src/lib/colour/index.ts';
import { colourReference as ref, near, nearTriple } from './reference.ts';

describe('the sRGB constants', () => {
	it.runIf(ref)('are the matrix and white of shared/reference/colour.json (IEC 61966-2-1:1999)', () => {
		expect(SRGB_TO_XYZ).toEqual(ref!.sRGB.matrix_sRGB_linear_to_XYZ);
		expect(D65_WHITE).toEqual(ref!.sRGB.white_D65_XYZ);
	});
});

describe('the sRGB transfer function, IEC 61966-2-1:1999', () => {
	it('encodes 0.18 as 0.461356129500442 and decodes it back (colour-science test_srgb.py, oetf_sRGB(0.18), 7 places)', () => {
		near(linearToSrgb(0.18), 0.461356129500442, 5e-8, 'linearToSrgb(0.18)');
		near(srgbToLinear(0.461356129500442), 0.18, 5e-8, 'srgbToLinear(0.461356…)');
	});

	it('has its two pieces meet at the thresholds the standard gives (0.04045 encoded ↔ 0.0031308 linear)', () => {
		// Both pieces of the decoding evaluated at 0.04045 land on 0.0031308 to the standard's 5 significant figures.
		near(0.04045 / 12.92, 0.0031308, 5e-8, 'linear piece at 0.04045');
		near(((0.04045 + 0.055) / 1.055) ** 2.4, 0.0031308, 5e-8, 'power piece at 0.04045');
		near(srgbToLinear(0.04045), 0.0031308, 5e-8, 'srgbToLinear(0.04045)');
		near(linearToSrgb(0.0031308), 0.04045, 5e-7, 'linearToSrgb(0.0031308)');
	});

	it('decodes and encodes as inverses over all 256 8-bit values (the standard defines one as the inverse of the other)', () => {
		for (let i = 0; i <= 255; i++) near(255 * linearToSrgb(srgbToLinear(i / 255)), i, 1e-4, `value ${i}`);
	});
});

describe('srgbToLab (IEC 61966-2-1 sRGB, CIE 15 L*a*b*, D65 white 95.047 / 100 / 108.883)', () => {
	// The standard's matrix is printed to 4 decimals; its row sums (0.9505, 1.0000, 1.0890) differ from
	// the 95.047 / 108.883 white in the 5th figure, which moves a* and b* of white by under 0.02 (the
	// difference colour.json allows between libraries).
	it('gives white (255, 255, 255) as L*a*b* (100, 0, 0) (colour.json worked_values)', () => {
		const [l, a, b] = srgbToLab([255, 255, 255]);
		near(l, 100, 1e-9, 'L*');
		near(a, 0, 0.02, 'a*');
		near(b, 0, 0.02, 'b*');
	});

	it('gives grey (128, 128, 128) L* 53.5850 and a neutral a*, b* (colour.json worked_values)', () => {
		const [l, a, b] = srgbToLab([128, 128, 128]);
		near(l, 53.585, 5e-5, 'L*');
		near(a, 0, 0.02, 'a*');
		near(b, 0, 0.02, 'b*');
	});

	it('gives red (255, 0, 0) about (53.24, 80.09, 67.20) (colour.json worked_values)', () => {
		// ± 0.025: the 0.02 colour.json allows for matrix precision, plus 0.005 for the 2-decimal quote.
		nearTriple(srgbToLab([255, 0, 0]), [53.24, 80.09, 67.2], 0.025, 'red');
	});

	it('gives blue (0, 0, 255) about (32.30, 79.19, −107.86) (a commonly quoted value, from memory)', () => {
		nearTriple(srgbToLab([0, 0, 255]), [32.3, 79.19, -107.86], 0.025, 'blue');
	});

	it('agrees with culori, an independent implementation, to 0.02 across the cube (colour.json: libraries differ by up to 0.02)', () => {
		// culori builds its matrix and white from the chromaticities to full precision, so this also
		// bounds what the 4-decimal matrix costs.
		const lab = converter('lab65');
		for (let r = 0; r <= 255; r += 51) {
			for (let g = 0; g <= 255; g += 51) {
				for (let b = 0; b <= 255; b += 51) {
					const want = lab({ mode: 'rgb', r: r / 255, g: g / 255, b: b / 255 });
					nearTriple(srgbToLab([r, g, b]), [want.l, want.a, want.b], 0.02, `(${r}, ${g}, ${b})`);
				}
			}
		}
	});

	it('gives black L* 0 (CIE 15: Y = 0 gives L* = 0)', () => {
		expect(srgbToLab([0, 0, 0])).toEqual([0, 0, 0]);
	});
});

describe('xyzToLab near black (CIE 15:2004, L* = 903.3 · Y/Yn below Y/Yn = 0.008856)', () => {
	it('follows the linear segment: Y = 0.5 gives L* 4.5165', () => {
		// CIE 15 prints the rounded 903.3; the exact 24389/27 = 903.296 differs by 2·10⁻⁵ here.
		near(xyzToLab([0.475, 0.5, 0.544])[0], 903.3 * 0.005, 1e-4, 'L*');
	});

	it('meets the cube-root segment at L* = 8 (116 · (6/29) − 16, where the two pieces join)', () => {
		near(xyzToLab([95.047 * (216 / 24389), 100 * (216 / 24389), 108.883 * (216 / 24389)])[0], 8, 1e-9, 'L*');
	});
});

describe('srgbToXyz and linearRgbToXyz (Y = 100 scale)', () => {
	it('give white the matrix row sums times 100 (IEC 61966-2-1 matrix)', () => {
		nearTriple(srgbToXyz([255, 255, 255]), [95.05, 100, 108.9], 1e-9, 'white');
	});

	it('give a primary its matrix column: linear green 1 → (35.76, 71.52, 11.92)', () => {
		nearTriple(linearRgbToXyz([0, 1, 0]), [35.76, 71.52, 11.92], 1e-9, 'green');
	});
});

describe('bad input', () => {
	it('refuses NaN, out-of-range and malformed sRGB with a RangeError that names the channel', () => {
		expect(() => srgbToLab([Number.NaN, 0, 0])).toThrow(RangeError);
		expect(() => srgbToLab([0, Number.NaN, 0])).toThrow(/sRGB green must be a finite number \(got NaN\)/);
		expect(() => srgbToLab([0, 0, 256])).toThrow(/sRGB blue must be from 0 to 255 \(got 256\)/);
		expect(() => srgbToLab([-1, 0, 0])).toThrow(/sRGB red must be from 0 to 255/);
		expect(() => srgbToLab([0, 0, Infinity])).toThrow(RangeError);
		expect(() => srgbToLab([0, 0] as unknown as [number, number, number])).toThrow(/three numbers/);
		expect(() => srgbToXyz(['1', 0, 0] as unknown as [number, number, number])).toThrow(RangeError);
		expect(() => linearRgbToXyz([1.5, 0, 0])).toThrow(/Linear RGB red must be from 0 to 1/);
		expect(() => srgbToLinear(Number.NaN)).toThrow(RangeError);
		expect(() => linearToSrgb(Number.NaN)).toThrow(RangeError);
	});
});
