import { describe, expect, it } from 'vitest';
import {
	D65_WHITE,
	greyBalanceMatrix,
	linearRgbToXyz,
	vonKriesAdapt,
	vonKriesMatrix,
	whiteBalanceToGrey,
	xyzToLab,
	type ConeSpace,
	type Xyz,
} from '../../../src/lib/colour/index.ts';
import { near, nearTriple } from './reference.ts';

const CONES: ConeSpace[] = ['bradford', 'cat02'];

const expectIdentity = (m: readonly (readonly number[])[], what: string) =>
	m.forEach((row, i) => row.forEach((v, j) => near(v, i === j ? 1 : 0, 1e-12, `${what} [${i}][${j}]`)));

describe('vonKriesMatrix', () => {
	it('gives Lindbloom’s Bradford D65 → D50 matrix (brucelindbloom.com, Chromatic Adaptation; D65 0.95047/1/1.08883, D50 0.96422/1/0.82521)', () => {
		// Lindbloom prints 7 decimals.
		const lindbloom = [
			[1.0478112, 0.0228866, -0.050127],
			[0.0295424, 0.9904844, -0.0170491],
			[-0.0092345, 0.0150436, 0.7521316],
		];
		const m = vonKriesMatrix([0.95047, 1, 1.08883], [0.96422, 1, 0.82521], 'bradford');
		lindbloom.forEach((row, i) => row.forEach((v, j) => near(m[i]![j]!, v, 5e-7, `row ${i + 1}, column ${j + 1}`)));
	});

	it('is the identity when the two whites are the same', () => {
		for (const cone of CONES) {
			const m = vonKriesMatrix(D65_WHITE, D65_WHITE, cone);
			expectIdentity(m, cone);
		}
	});
});

describe('vonKriesAdapt', () => {
	// colour-science, colour/adaptation/tests/test_vonkries.py (chromatic_adaptation_VonKries, atol 1e-7):
	// a ColorChecker red under D65 adapted to the ColorChecker's own illuminant (CC I, near D50).
	const red: Xyz = [0.20654008, 0.12197225, 0.05136952];
	const d65: Xyz = [0.95045593, 1, 1.08905775];
	const ccI: Xyz = [0.96429568, 1, 0.8251046];
	const illA: Xyz = [1.09846607, 1, 0.3558228];

	it.each([
		['CAT02 (CIE 159:2004), red to CC I', red, ccI, 'cat02', [0.21638819, 0.1257, 0.03847494]],
		['CAT02, green to illuminant A', [0.1422201, 0.23042768, 0.10495772], illA, 'cat02', [0.18673833, 0.23111171, 0.03285972]],
		['Bradford (Lam 1985), red to CC I', red, ccI, 'bradford', [0.21666003, 0.12604777, 0.03855068]],
	] as [string, Xyz, Xyz, ConeSpace, Xyz][])('matches colour-science: %s', (what, xyz, target, cone, want) => {
		nearTriple(vonKriesAdapt(xyz, d65, target, cone), want, 1e-7, what);
	});

	it('takes the source white exactly to the target white (the definition of von Kries scaling)', () => {
		for (const cone of CONES) {
			nearTriple(vonKriesAdapt(d65, d65, ccI, cone), ccI, 1e-12, cone);
		}
	});
});

describe('white balance on a grey reference', () => {
	// A grey card photographed under warm light: the camera's linear RGB of a neutral card scaled by
	// the light's colour (red up, blue down). Invented, but any such cast must come back to neutral.
	const castGrey = linearRgbToXyz([0.26, 0.2, 0.12]);

	it('maps the grey under a colour cast to a* ≈ b* ≈ 0, keeping its Y (so its L*)', () => {
		const before = xyzToLab(castGrey);
		expect(Math.hypot(before[1], before[2])).toBeGreaterThan(10);
		for (const cone of CONES) {
			const balanced = whiteBalanceToGrey(castGrey, castGrey, cone);
			const [l, a, b] = xyzToLab(balanced);
			near(a, 0, 1e-9, `${cone} a*`);
			near(b, 0, 1e-9, `${cone} b*`);
			near(l, before[0], 1e-9, `${cone} L*`);
		}
	});

	it('changes nothing when the grey is already neutral D65', () => {
		const neutral: Xyz = [D65_WHITE[0] * 0.3, 30, D65_WHITE[2] * 0.3];
		const m = greyBalanceMatrix(neutral);
		expectIdentity(m, 'grey balance');
		const sample: Xyz = [40, 38, 20];
		nearTriple(whiteBalanceToGrey(sample, neutral), sample, 1e-9, 'sample');
	});

	it('moves a colour seen under the same cast in the direction the cast pushed it back', () => {
		// The cast makes everything warmer (b* up); after balancing, a sample's b* falls.
		const sample = linearRgbToXyz([0.3, 0.22, 0.08]);
		expect(xyzToLab(whiteBalanceToGrey(sample, castGrey))[2]).toBeLessThan(xyzToLab(sample)[2]);
	});

	it('refuses a black or non-neutral reference, NaN and an unknown cone space with a RangeError', () => {
		expect(() => greyBalanceMatrix([0, 0, 0])).toThrow(/Y above 0/);
		expect(() => greyBalanceMatrix([Number.NaN, 20, 20])).toThrow(RangeError);
		// Pure monochromatic-like XYZ with a negative Bradford S response: no white can look like that.
		expect(() => vonKriesMatrix([50, 80, 0], D65_WHITE)).toThrow(/positive response in all three cone channels/);
		expect(() => vonKriesMatrix(D65_WHITE, D65_WHITE, 'sharp' as ConeSpace)).toThrow(/cone space must be/);
	});
});
