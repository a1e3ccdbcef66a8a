import { describe, expect, it } from 'vitest';
import {
	compareFluidColour,
	deltaE2000,
	fluidColourSummary,
	linearRgbToXyz,
	NO_GREY_REASON,
	srgbToLinear,
	xyzToLab,
	yellownessIndexE313,
	type LinearRgb,
	type RegionMean,
} from '../../../src/lib/colour/index.ts';
import { near } from './reference.ts';

const region = (linearRgb: LinearRgb | null, count = 5000, skipped = 0): RegionMean => ({ linearRgb, count, skipped });
const lin = (r: number, g: number, b: number): LinearRgb => [srgbToLinear(r / 255), srgbToLinear(g / 255), srgbToLinear(b / 255)];

/** A warm light: the camera sees every colour with red raised and blue lowered (invented, but typical of tungsten). */
const warm = (c: LinearRgb): LinearRgb => [Math.min(1, c[0] * 1.25), c[1], c[2] * 0.6];

const neutralGrey = lin(128, 128, 128);
const paleYellowFluid = lin(205, 190, 140);

describe('fluidColourSummary', () => {
	it('without a grey reference gives the photo’s colour as taken, marked unreliable with the reason', () => {
		const s = fluidColourSummary(region(paleYellowFluid));
		const xyz = linearRgbToXyz(paleYellowFluid);
		expect(s.lab).toEqual(xyzToLab(xyz));
		expect(s.yellowness).toBe(yellownessIndexE313(xyz, 'D65/2'));
		expect(s).toMatchObject({ whiteBalanced: false, reliable: false, illuminant: 'D65/2' });
		expect(s.reasons).toEqual([NO_GREY_REASON]);
		expect(NO_GREY_REASON).toBe('No grey reference in this photo: colour not white-balanced');
	});

	it('with a usable grey is white-balanced and reliable, and a neutral fluid reads a* ≈ b* ≈ 0 and YI ≈ 0 (ASTM E313: the D65 white has YI 0 under D65/2°)', () => {
		const s = fluidColourSummary(region(lin(180, 180, 180)), region(neutralGrey));
		expect(s).toMatchObject({ whiteBalanced: true, reliable: true, reasons: [] });
		near(s.lab[1], 0, 1e-9, 'a*');
		near(s.lab[2], 0, 1e-9, 'b*');
		// The D65 white under the D65/2° coefficients: 1.2985·95.047 − 1.1335·108.883 = −0.0003 (4-decimal coefficients).
		near(s.yellowness, 0, 0.01, 'YI');
	});

	it('undoes a colour cast carried by the grey: the fluid under warm light measures close to the fluid under daylight', () => {
		const daylight = fluidColourSummary(region(paleYellowFluid), region(neutralGrey));
		const asShot = fluidColourSummary(region(warm(paleYellowFluid)));
		const balanced = fluidColourSummary(region(warm(paleYellowFluid)), region(warm(neutralGrey)));
		// The cast is made in camera RGB and undone in the Bradford cone space, so the two need not agree
		// exactly; the white balance must still remove most of the error.
		const before = deltaE2000(asShot.lab, daylight.lab);
		const after = deltaE2000(balanced.lab, daylight.lab);
		expect(before).toBeGreaterThan(5);
		expect(after).toBeLessThan(before / 3);
		expect(Math.abs(balanced.yellowness - daylight.yellowness)).toBeLessThan(Math.abs(asShot.yellowness - daylight.yellowness) / 3);
	});

	it('uses the requested illuminant for the yellowness index', () => {
		const s = fluidColourSummary(region(paleYellowFluid), region(neutralGrey), { illuminant: 'D65/10' });
		expect(s.illuminant).toBe('D65/10');
		expect(s.yellowness).toBe(yellownessIndexE313(s.xyz, 'D65/10'));
	});

	it('warns about too few pixels and about a region mostly clipped (thresholds: common practice, no published source)', () => {
		const few = fluidColourSummary(region(paleYellowFluid, 12), region(neutralGrey));
		expect(few.reliable).toBe(false);
		expect(few.reasons).toEqual([expect.stringMatching(/Only 12 usable pixels in the fluid region/)]);
		const glare = fluidColourSummary(region(paleYellowFluid, 600, 400), region(neutralGrey, 2500, 2500));
		expect(glare.reasons).toEqual([
			expect.stringMatching(/^40 % of the fluid region is too bright or too dark/),
			expect.stringMatching(/^50 % of the grey reference is too bright or too dark/),
		]);
	});

	it('does not white-balance on a grey reference with no usable pixels, and says so', () => {
		const s = fluidColourSummary(region(paleYellowFluid), region(null, 0, 300));
		expect(s.whiteBalanced).toBe(false);
		expect(s.reasons).toEqual([expect.stringMatching(/^The grey reference has no usable pixels/)]);
	});

	it('refuses a fluid region with no usable pixels (RangeError): it has no colour', () => {
		expect(() => fluidColourSummary(region(null, 0, 0), region(neutralGrey))).toThrow(/fluid region has no usable pixels/);
	});

	it('refuses NaN in a region mean with a RangeError', () => {
		expect(() => fluidColourSummary(region([Number.NaN, 0.2, 0.2]))).toThrow(/Linear RGB red must be a finite number/);
		expect(() => fluidColourSummary(region(paleYellowFluid), region([0.2, Number.NaN, 0.2]))).toThrow(RangeError);
	});
});

describe('compareFluidColour', () => {
	const earlier = fluidColourSummary(region(lin(200, 195, 170)), region(neutralGrey));
	const later = fluidColourSummary(region(lin(200, 185, 120)), region(neutralGrey));

	it('gives ΔE00 between the two colours and a positive change of yellowness when the fluid yellowed', () => {
		const c = compareFluidColour(earlier, later);
		expect(c.deltaE00).toBe(deltaE2000(earlier.lab, later.lab));
		expect(c.deltaE00).toBeGreaterThan(5);
		expect(c.deltaYellowness).toBe(later.yellowness - earlier.yellowness);
		expect(c.deltaYellowness).toBeGreaterThan(0);
		expect(c).toMatchObject({ reliable: true, reasons: [] });
	});

	it('gives 0 for the same colour twice', () => {
		expect(compareFluidColour(earlier, earlier)).toMatchObject({ deltaE00: 0, deltaYellowness: 0, reliable: true });
	});

	it('is unreliable when either photo is, naming which', () => {
		const c = compareFluidColour(earlier, fluidColourSummary(region(lin(200, 185, 120))));
		expect(c.reliable).toBe(false);
		expect(c.reasons).toEqual([`Second photo: ${NO_GREY_REASON}`, expect.stringMatching(/^Only one of the two photos is white-balanced/)]);
	});

	it('refuses to subtract yellowness indices of different illuminants', () => {
		const d65_10 = fluidColourSummary(region(lin(200, 185, 120)), region(neutralGrey), { illuminant: 'D65/10' });
		expect(() => compareFluidColour(earlier, d65_10)).toThrow(/different illuminants/);
	});
});
