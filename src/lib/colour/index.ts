/**
 * Fluid colour measurement from photographs: sRGB → XYZ → L*a*b* (IEC 61966-2-1, CIE 15), ΔE00
 * (CIEDE2000, via culori), ASTM E313 yellowness, von Kries white balance on a grey reference, and
 * mean colours of marked regions. Pure computation, no I/O: the same numbers in the browser and on
 * the server.
 */
export type { Lab, LinearRgb, Rgb8, Triple, Xyz } from './triple.ts';
export type { Matrix3 } from './matrix3.ts';
export { D65_WHITE, linearRgbToXyz, linearToSrgb, SRGB_TO_XYZ, srgbToLinear, srgbToLinearRgb, srgbToXyz } from './srgb.ts';
export { srgbToLab, xyzToLab } from './lab.ts';
export { deltaE2000 } from './ciede2000.ts';
export { E313_COEFFICIENTS, yellownessIndexE313, type E313Illuminant } from './yellowness.ts';
export {
	CONE_MATRICES,
	greyBalanceMatrix,
	vonKriesAdapt,
	vonKriesMatrix,
	whiteBalanceToGrey,
	type ConeSpace,
} from './adaptation.ts';
export {
	CLIP_HIGH,
	CLIP_LOW,
	isNearClipped,
	meanColourInBox,
	meanColourInPolygon,
	type PhotoBox,
	type RegionMean,
} from './region.ts';
export {
	compareFluidColour,
	fluidColourSummary,
	MAX_SKIPPED_SHARE,
	MIN_PIXELS,
	NO_GREY_REASON,
	type FluidColour,
	type FluidColourChange,
	type FluidColourOptions,
} from './fluid.ts';
