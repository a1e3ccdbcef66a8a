/**
 * Fluid colour of one photo and its change between two: the mean colour inside the fluid mark,
 * white-balanced on the photo's grey reference when there is one, as L*a*b* and as an ASTM E313
 * yellowness index; and between two photos ΔE00 and the change in yellowness. Every result says
 * whether it can be trusted and, when not, why, in words a conservator can act on.
 */
import { greyBalanceMatrix, type ConeSpace } from './adaptation.ts';
import { deltaE2000 } from './ciede2000.ts';
import { xyzToLab } from './lab.ts';
import { apply3, type Matrix3 } from './matrix3.ts';
import type { RegionMean } from './region.ts';
import { linearRgbToXyz } from './srgb.ts';
import type { Lab, Xyz } from './triple.ts';
import { yellownessIndexE313, type E313Illuminant } from './yellowness.ts';

export interface FluidColourOptions {
	/** Default 'D65/2', the illuminant and observer sRGB is defined for (see yellowness.ts). */
	illuminant?: E313Illuminant;
	/** Cone space of the white balance; default 'bradford'. */
	cone?: ConeSpace;
}

export interface FluidColour {
	lab: Lab;
	/** The (white-balanced when possible) XYZ behind lab and yellowness, Y = 100 scale. */
	xyz: Xyz;
	yellowness: number;
	illuminant: E313Illuminant;
	whiteBalanced: boolean;
	reliable: boolean;
	reasons: string[];
}

export interface FluidColourChange {
	deltaE00: number;
	/** Second minus first: positive when the fluid got yellower. */
	deltaYellowness: number;
	reliable: boolean;
	reasons: string[];
}

export const NO_GREY_REASON = 'No grey reference in this photo: colour not white-balanced';

/**
 * Fewer usable pixels than this and a region's mean moves with JPEG noise and single specks; more
 * than this share near-clipped and what is left may not be representative. Common practice, no
 * published source.
 */
export const MIN_PIXELS = 100;
export const MAX_SKIPPED_SHARE = 0.25;

/** Why a region's mean may not be representative, or nothing. */
function regionWarnings(what: string, region: RegionMean): string[] {
	const out: string[] = [];
	const inside = region.count + region.skipped;
	if (region.count < MIN_PIXELS) {
		out.push(`Only ${region.count} usable pixels in the ${what}: too few for a steady mean (at least ${MIN_PIXELS})`);
	}
	if (inside > 0 && region.skipped / inside > MAX_SKIPPED_SHARE) {
		const pct = Math.round((100 * region.skipped) / inside);
		out.push(`${pct} % of the ${what} is too bright or too dark to measure (glare or deep shadow)`);
	}
	return out;
}

/** The grey-balance matrix, or the reason there is none. */
function greyBalance(grey: RegionMean | null | undefined, cone: ConeSpace): { matrix: Matrix3 } | { reason: string } {
	if (!grey) return { reason: NO_GREY_REASON };
	if (!grey.linearRgb) {
		return { reason: 'The grey reference has no usable pixels (outside the photo, or all too bright or too dark): colour not white-balanced' };
	}
	// Malformed numbers are the caller's error and throw; only a grey that cannot serve as one is a reason.
	const greyXyz = linearRgbToXyz(grey.linearRgb);
	try {
		return { matrix: greyBalanceMatrix(greyXyz, cone) };
	} catch (e) {
		if (e instanceof RangeError) return { reason: `The grey reference cannot be used for white balance: ${e.message}` };
		throw e;
	}
}

/**
 * The colour of the fluid in one photo from the mean of its fluid region and, if the photo has
 * one, of its grey reference. Without a usable grey the numbers are still given (they describe the
 * photo as taken) but marked unreliable. A fluid region with no usable pixels has no colour: that
 * is a RangeError, not a number.
 */
export function fluidColourSummary(
	fluid: RegionMean,
	grey?: RegionMean | null,
	options: FluidColourOptions = {},
): FluidColour {
	const illuminant = options.illuminant ?? 'D65/2';
	const cone = options.cone ?? 'bradford';
	if (!fluid.linearRgb) {
		throw new RangeError(
			'The fluid region has no usable pixels (outside the photo, or all too bright or too dark): its colour cannot be measured.',
		);
	}
	const reasons = regionWarnings('fluid region', fluid);
	const balance = greyBalance(grey, cone);
	const measured = linearRgbToXyz(fluid.linearRgb);
	let xyz: Xyz = measured;
	if ('matrix' in balance) {
		xyz = apply3(balance.matrix, measured);
		if (grey) reasons.push(...regionWarnings('grey reference', grey));
	} else {
		reasons.unshift(balance.reason);
	}
	return {
		lab: xyzToLab(xyz),
		xyz,
		yellowness: yellownessIndexE313(xyz, illuminant),
		illuminant,
		whiteBalanced: 'matrix' in balance,
		reliable: reasons.length === 0,
		reasons,
	};
}

/** The change of fluid colour from photo `a` to photo `b`. */
export function compareFluidColour(a: FluidColour, b: FluidColour): FluidColourChange {
	if (a.illuminant !== b.illuminant) {
		throw new RangeError(`Yellowness indices for different illuminants (${a.illuminant}, ${b.illuminant}) cannot be subtracted.`);
	}
	const reasons = [...a.reasons.map((r) => `First photo: ${r}`), ...b.reasons.map((r) => `Second photo: ${r}`)];
	if (a.whiteBalanced !== b.whiteBalanced) {
		reasons.push('Only one of the two photos is white-balanced: the difference mixes the change of light with the change of fluid');
	}
	return {
		deltaE00: deltaE2000(a.lab, b.lab),
		deltaYellowness: b.yellowness - a.yellowness,
		reliable: reasons.length === 0,
		reasons,
	};
}
