import { checkPercentVol, checkTemperature, densityAtPercentVol } from './alcoholometry.ts';
import { crossSectionMm2, innerVolumeMl, type Jar } from './jar.ts';

/**
 * The airspace a jar needs: fluid filled at one temperature expands as the store warms; the jar
 * expands too, but glass far less than spirit (OIML densities for the fluid, cubic expansion for the
 * container). The result is the least headspace that keeps the fluid off the lid at the warmest
 * expected temperature. No published rule sets the margin to leave on top of it (TRADE.md: "common
 * practice; no published numeric rule was found").
 */
export const CONTAINER_EXPANSION_PER_K = {
	'soda-lime': 25e-6,
	borosilicate: 10e-6,
	// Poly(methyl methacrylate): linear about 7 × 10⁻⁵ /K, so cubic about 2.1 × 10⁻⁴ /K (from memory).
	acrylic: 2.1e-4,
} as const;
export type ContainerMaterial = keyof typeof CONTAINER_EXPANSION_PER_K;

export interface AirspaceInput {
	jar: Jar;
	material: ContainerMaterial;
	percentVol: number;
	fillTempC: number;
	maxTempC: number;
	/** Volume of the specimen and its mount, mL (taken to expand like water, i.e. negligibly here). */
	displacementMl?: number;
}

export interface AirspaceResult {
	/** Relative growth of the fluid from fill to warmest: ρ(fill)/ρ(max) − 1. */
	fluidExpansion: number;
	/** Relative growth of the jar's inner volume over the same rise. */
	containerExpansion: number;
	/** The largest fluid volume that may go in at the fill temperature, mL. */
	maxFillMl: number;
	/** The level that volume reaches at the fill temperature, mm above the inner base. */
	maxFillLevelMm: number;
	/** Headspace to leave at filling: inner height − that level, mm, and as a volume, mL. */
	headspaceMm: number;
	headspaceMl: number;
	densities: { fillKgM3: number; maxKgM3: number };
}

export function airspace(i: AirspaceInput): AirspaceResult {
	checkPercentVol('The strength', i.percentVol);
	checkTemperature(i.fillTempC);
	checkTemperature(i.maxTempC);
	if (i.maxTempC < i.fillTempC) throw new RangeError('The warmest expected temperature must not be below the filling temperature.');
	const alpha = CONTAINER_EXPANSION_PER_K[i.material];
	if (alpha === undefined) throw new RangeError('The jar material must be soda-lime, borosilicate or acrylic.');
	const displacement = i.displacementMl ?? 0;
	if (!Number.isFinite(displacement) || displacement < 0) throw new RangeError('The specimen displacement must be 0 mL or more.');
	const jarMl = innerVolumeMl(i.jar);
	if (displacement >= jarMl) throw new RangeError('The specimen cannot displace the whole jar.');
	const fill = densityAtPercentVol(i.percentVol, i.fillTempC);
	const max = densityAtPercentVol(i.percentVol, i.maxTempC);
	const fluidExpansion = fill / max - 1;
	const containerExpansion = alpha * (i.maxTempC - i.fillTempC);
	// (V_fill · ρfill/ρmax) + displacement ≤ V_jar · (1 + αΔt)
	const maxFillMl = Math.min(jarMl - displacement, (jarMl * (1 + containerExpansion) - displacement) / (1 + fluidExpansion));
	const area = crossSectionMm2(i.jar);
	const maxFillLevelMm = ((maxFillMl + displacement) * 1000) / area;
	return {
		fluidExpansion,
		containerExpansion,
		maxFillMl,
		maxFillLevelMm,
		headspaceMm: i.jar.heightMm - maxFillLevelMm,
		headspaceMl: jarMl - displacement - maxFillMl,
		densities: { fillKgM3: fill, maxKgM3: max },
	};
}
