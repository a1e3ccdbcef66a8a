/**
 * Jar geometry from inner dimensions in mm: cylinders (diameter), oval jars (an elliptic section,
 * major and minor axes) and rectangular jars (width and depth), all with straight sides up to the
 * inner height. Volumes in mL (1 mL = 1000 mm³).
 */
export type JarShape = 'cylinder' | 'oval' | 'rectangular';

export interface Jar {
	shape: JarShape;
	/** Diameter (cylinder), major axis (oval) or width (rectangular), mm. */
	widthMm: number;
	/** Minor axis (oval) or depth (rectangular), mm; ignored for a cylinder. */
	depthMm?: number | null;
	/** Inner height from the inner base to the underside of the lid, mm. */
	heightMm: number;
}

function dimension(name: string, v: number | null | undefined): number {
	if (typeof v !== 'number' || !Number.isFinite(v) || v <= 0) throw new RangeError(`${name} must be more than 0 mm.`);
	if (v > 5000) throw new RangeError(`${name} must be at most 5000 mm.`);
	return v;
}

/** Area of the jar's inner cross-section, mm². */
export function crossSectionMm2(jar: Jar): number {
	const w = dimension('The inner width', jar.widthMm);
	switch (jar.shape) {
		case 'cylinder':
			return Math.PI * (w / 2) ** 2;
		case 'oval': {
			const d = dimension('The minor axis', jar.depthMm);
			if (d > w) throw new RangeError('The minor axis cannot be longer than the major axis.');
			return Math.PI * (w / 2) * (d / 2);
		}
		case 'rectangular':
			return w * dimension('The inner depth', jar.depthMm);
		default:
			throw new RangeError('The jar shape must be cylinder, oval or rectangular.');
	}
}

/** The whole inner volume, mL. */
export function innerVolumeMl(jar: Jar): number {
	return (crossSectionMm2(jar) * dimension('The inner height', jar.heightMm)) / 1000;
}

/** mL of fluid per mm of level: what one millimetre of evaporation costs. */
export function mlPerMm(jar: Jar): number {
	return crossSectionMm2(jar) / 1000;
}

function checkDisplacement(ml: number): number {
	if (typeof ml !== 'number' || !Number.isFinite(ml) || ml < 0) throw new RangeError('The specimen displacement must be 0 mL or more.');
	return ml;
}

/**
 * Fluid volume when the level stands `levelMm` above the inner base, less what a submerged specimen
 * (and its mount) displaces.
 */
export function fluidVolumeMl(jar: Jar, levelMm: number, displacementMl = 0): number {
	if (typeof levelMm !== 'number' || !Number.isFinite(levelMm) || levelMm < 0) throw new RangeError('The fluid level must be 0 mm or more.');
	const height = dimension('The inner height', jar.heightMm);
	if (levelMm > height) throw new RangeError(`The fluid level cannot be above the inner height (${height} mm).`);
	const v = (crossSectionMm2(jar) * levelMm) / 1000 - checkDisplacement(displacementMl);
	if (v < 0) throw new RangeError('The specimen displaces more than the fluid at this level: check the displacement.');
	return v;
}

/** The level in mm that a fluid volume reaches, with a submerged specimen's displacement. */
export function levelForVolumeMm(jar: Jar, volumeMl: number, displacementMl = 0): number {
	if (typeof volumeMl !== 'number' || !Number.isFinite(volumeMl) || volumeMl < 0) throw new RangeError('The volume must be 0 mL or more.');
	return ((volumeMl + checkDisplacement(displacementMl)) * 1000) / crossSectionMm2(jar);
}
