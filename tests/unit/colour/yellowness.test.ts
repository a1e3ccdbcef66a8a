import { describe, expect, it } from 'vitest';
import { E313_COEFFICIENTS, yellownessIndexE313, type E313Illuminant, type Xyz } from '../../../src/lib/colour/index.ts';
import { colourReference as ref, near } from './reference.ts';

describe('yellownessIndexE313, YI = 100 (Cx·X − Cz·Z) / Y (ASTM E313)', () => {
	it.runIf(ref)('uses the coefficients of shared/reference/colour.json (ASTM E313 table)', () => {
		const c = ref!.yellowness_astm_e313.coefficients;
		for (const [k, ill] of [['C/2deg', 'C/2'], ['D65/2deg', 'D65/2'], ['C/10deg', 'C/10'], ['D65/10deg', 'D65/10']] as const) {
			expect(E313_COEFFICIENTS[ill]).toEqual({ cx: c[k]!.C_X, cz: c[k]!.C_Z });
		}
	});

	it('gives 4.34 for XYZ (95, 100, 105) under D65/2° (colour.json worked example; ASTM E313)', () => {
		// By hand: 100 (1.2985·95 − 1.1335·105) / 100 = 123.3575 − 119.0175 = 4.3400.
		near(yellownessIndexE313([95, 100, 105], 'D65/2'), 4.34, 5e-9, 'YI');
	});

	it('defaults to D65/2°, the illuminant and observer of sRGB-derived XYZ', () => {
		expect(yellownessIndexE313([95, 100, 105])).toBe(yellownessIndexE313([95, 100, 105], 'D65/2'));
	});

	it('gives a hand-worked case for each illuminant (ASTM E313 coefficients)', () => {
		// XYZ (80, 82, 60) under C/2°: 100 (1.2769·80 − 1.0592·60) / 82 = 100 (102.152 − 63.552) / 82 = 3860 / 82 = 47.07317.
		near(yellownessIndexE313([80, 82, 60], 'C/2'), 47.07317, 5e-6, 'C/2');
		// XYZ (95, 100, 105) under D65/10°: 1.3013·95 − 1.1498·105 = 123.6235 − 120.729 = 2.8945.
		near(yellownessIndexE313([95, 100, 105], 'D65/10'), 2.8945, 5e-9, 'D65/10');
		// XYZ (95, 100, 105) under C/10°: 1.2871·95 − 1.0781·105 = 122.2745 − 113.2005 = 9.074.
		near(yellownessIndexE313([95, 100, 105], 'C/10'), 9.074, 5e-9, 'C/10');
	});

	it('gives the perfect diffuser YI ≈ 0 under its own illuminant (ASTM E313 chooses Cx, Cz so; white points from ASTM E308, from memory)', () => {
		// The coefficients have 4 decimals: ±0.00005 · ~100 on each of Cx·X and Cz·Z is up to ±0.01 of YI.
		const whites: [E313Illuminant, Xyz][] = [
			['D65/2', [95.047, 100, 108.883]],
			['D65/10', [94.811, 100, 107.304]],
			['C/2', [98.074, 100, 118.232]],
			['C/10', [97.285, 100, 116.145]],
		];
		for (const [ill, white] of whites) near(yellownessIndexE313(white, ill), 0, 0.01, `perfect diffuser under ${ill}`);
	});

	it('reads the D65/2° white about −1.5 with the D65/10° set, which is why sRGB data use D65/2°', () => {
		// By hand: 1.3013·95.047 − 1.1498·108.883 = 123.6847 − 125.1937 = −1.5090.
		near(yellownessIndexE313([95.047, 100, 108.883], 'D65/10'), -1.509, 5e-4, 'D65/2 white under D65/10');
	});

	it('is positive for a yellowish sample and negative for a bluish one (ASTM E313: positive YI is yellower)', () => {
		expect(yellownessIndexE313([90, 95, 80])).toBeGreaterThan(0);
		expect(yellownessIndexE313([85, 90, 110])).toBeLessThan(0);
	});

	it('refuses Y of 0, NaN and an unknown illuminant with a RangeError', () => {
		expect(() => yellownessIndexE313([0, 0, 0])).toThrow(/Y above 0/);
		expect(() => yellownessIndexE313([95, Number.NaN, 105])).toThrow(/XYZ Y must be a finite number/);
		expect(() => yellownessIndexE313([95, 100, 105], 'A/2' as E313Illuminant)).toThrow(/illuminant must be one of/);
		expect(() => yellownessIndexE313([95, 100, 105], 'toString' as E313Illuminant)).toThrow(RangeError);
	});
});
