/**
 * White balance as a von Kries chromatic adaptation: XYZ into a cone-like space, each channel
 * scaled by target white / source white, and back, i.e. M⁻¹ · diag(ρ′/ρ) · M. Used to make the grey
 * card in a photo neutral so that two photos taken under different light can be compared.
 *
 * Cone spaces:
 * - 'bradford': Lam (1985), as tabulated by Lindbloom (brucelindbloom.com, "Chromatic Adaptation")
 *   and used by ICC profiles.
 * - 'cat02': CIE 159:2004 (CIECAM02) M_CAT02.
 * Both matrices are written from memory and agree with the copies in colour-science
 * (colour/adaptation/datasets/cat.py); the tests check the results against Lindbloom's and
 * colour-science's published adaptations.
 */
import { apply3, invert3, multiply3, type Matrix3 } from './matrix3.ts';
import { D65_WHITE } from './srgb.ts';
import { checkTriple, XYZ_NAMES, type Xyz } from './triple.ts';

export type ConeSpace = 'bradford' | 'cat02';

export const CONE_MATRICES: Readonly<Record<ConeSpace, Matrix3>> = {
	bradford: [
		[0.8951, 0.2664, -0.1614],
		[-0.7502, 1.7135, 0.0367],
		[0.0389, -0.0685, 1.0296],
	],
	cat02: [
		[0.7328, 0.4296, -0.1624],
		[-0.7036, 1.6975, 0.0061],
		[0.003, 0.0136, 0.9834],
	],
};

const INVERSES: Readonly<Record<ConeSpace, Matrix3>> = {
	bradford: invert3(CONE_MATRICES.bradford),
	cat02: invert3(CONE_MATRICES.cat02),
};

function coneMatrix(cone: ConeSpace): Matrix3 {
	if (!Object.hasOwn(CONE_MATRICES, cone)) throw new RangeError(`The cone space must be 'bradford' or 'cat02' (got ${String(cone)}).`);
	return CONE_MATRICES[cone];
}

/**
 * The 3 × 3 matrix that takes XYZ seen under `sourceWhite` to XYZ under `targetWhite` (both on
 * one scale). A white whose cone response is not positive (black, or a saturated colour given by
 * mistake) cannot be divided by, so it is refused.
 */
export function vonKriesMatrix(sourceWhite: Xyz, targetWhite: Xyz, cone: ConeSpace = 'bradford'): Matrix3 {
	checkTriple('The source white', sourceWhite, XYZ_NAMES);
	checkTriple('The target white', targetWhite, XYZ_NAMES);
	const m = coneMatrix(cone);
	const src = apply3(m, sourceWhite);
	const dst = apply3(m, targetWhite);
	if (!src.every((v) => v > 0) || !dst.every((v) => v > 0)) {
		throw new RangeError(
			'A white for chromatic adaptation must have a positive response in all three cone channels: is it a neutral?',
		);
	}
	const scale: Matrix3 = [
		[dst[0] / src[0], 0, 0],
		[0, dst[1] / src[1], 0],
		[0, 0, dst[2] / src[2]],
	];
	return multiply3(INVERSES[cone], scale, m);
}

/** `xyz` seen under `sourceWhite`, adapted to `targetWhite` (default the D65 white). */
export function vonKriesAdapt(
	xyz: Xyz,
	sourceWhite: Xyz,
	targetWhite: Xyz = D65_WHITE,
	cone: ConeSpace = 'bradford',
): [number, number, number] {
	checkTriple('XYZ', xyz, XYZ_NAMES);
	return apply3(vonKriesMatrix(sourceWhite, targetWhite, cone), xyz);
}

/**
 * The adaptation that turns the photographed grey reference `greyXyz` into a neutral D65 grey of
 * the same Y. Only the colour of the light is corrected, not the exposure: a grey card's
 * reflectance is not known here, so scaling it to any particular lightness would be a guess.
 */
export function greyBalanceMatrix(greyXyz: Xyz, cone: ConeSpace = 'bradford'): Matrix3 {
	checkTriple('The grey reference XYZ', greyXyz, XYZ_NAMES);
	const y = greyXyz[1];
	if (!(y > 0)) throw new RangeError(`The grey reference must have Y above 0 (got ${y}): it is black or missing.`);
	const neutral: Xyz = [(D65_WHITE[0] * y) / 100, y, (D65_WHITE[2] * y) / 100];
	return vonKriesMatrix(greyXyz, neutral, cone);
}

/** `xyz` from a photo whose grey reference measured `greyXyz`, corrected so that grey is neutral D65. */
export function whiteBalanceToGrey(xyz: Xyz, greyXyz: Xyz, cone: ConeSpace = 'bradford'): [number, number, number] {
	checkTriple('XYZ', xyz, XYZ_NAMES);
	return apply3(greyBalanceMatrix(greyXyz, cone), xyz);
}
