import { airspace, type ContainerMaterial } from '../fluid/airspace.ts';
import { mlPerMm, type Jar } from '../fluid/jar.ts';
import type { PreservativeKind } from '../specimen/vocabulary.ts';

/**
 * Airspace at risk: a jar whose latest level stands above the safe filling level that airspace()
 * gives for its store's warmest temperature would press fluid against the lid (or build pressure)
 * on the warmest day. For each such jar: how much to draw off, or which cooler store would suit it.
 */

/** Filling temperature when the check recorded none: the alcohol meter's reference temperature. */
export const DEFAULT_FILL_TEMP_C = 20;

/**
 * Strength assumed for an ethanol or IMS jar whose strength was never measured: 70 % vol, the usual
 * storage strength (TRADE.md [S4][S11][S13]). Stronger spirit expands a little more, so this can
 * understate the need by a fraction of a millimetre; the row says it is an assumption.
 */
export const ASSUMED_SPIRIT_PERCENT_VOL = 70;

/**
 * The largest relative expansion per kelvin of any ethanol–water mixture in the OIML R 22 range:
 * 1.141 × 10⁻³ /K (pure ethanol between 39 and 40 °C, from densityKgM3 on a grid of strengths and
 * temperatures; the unit test repeats the search). Rounded up, it bounds the expansion of every jar
 * airspace() can assess, so the server skips, in SQL, jars that cannot be at risk whatever their
 * strength (the glass's own expansion only adds room).
 */
export const MAX_EXPANSION_PER_K = 1.15e-3;

/**
 * True when a jar could be at risk: its level is above the inner height over (1 + bound × ΔT). Below
 * that, airspace() would find it safe whatever the strength. The server applies the same test in SQL.
 */
export function couldBeAtRisk(innerHeightMm: number, levelMm: number, fillTempC: number, maxTempC: number): boolean {
	return levelMm > innerHeightMm / (1 + MAX_EXPANSION_PER_K * Math.max(0, maxTempC - fillTempC));
}

export type AirspaceFluid = { percentVol: number; basis: 'measured' | 'assumed' | 'water' };

/** The preservatives airspaceFluid() can assess. */
export const AIRSPACE_KINDS = ['ethanol', 'industrial-spirit', 'formalin'] as const satisfies readonly PreservativeKind[];

/**
 * The strength to assess a jar at, or null when Meniscus cannot assess its fluid: the OIML formula
 * is for ethanol–water only. Ethanol and IMS at their measured real strength (70 % vol assumed when
 * none); formalin, about 96 % water, as water (0 % vol), which its small formaldehyde and methanol
 * content changes little. Propan-2-ol, unknown and other fluids are not assessed.
 */
export function airspaceFluid(kind: PreservativeKind, realPercentVol: number | null): AirspaceFluid | null {
	if (kind === 'ethanol' || kind === 'industrial-spirit') {
		return realPercentVol === null ? { percentVol: ASSUMED_SPIRIT_PERCENT_VOL, basis: 'assumed' } : { percentVol: realPercentVol, basis: 'measured' };
	}
	if (kind === 'formalin') return { percentVol: 0, basis: 'water' };
	return null;
}

export interface JarFill {
	jar: Jar;
	material: ContainerMaterial;
	percentVol: number;
	/** The level at the latest check, mm above the inner base. */
	levelMm: number;
	/** The temperature the level was read at. */
	fillTempC: number;
}

export interface AirspaceVerdict {
	/** The highest level at the filling temperature that stays off the lid at the warmest (airspace().maxFillLevelMm). */
	safeLevelMm: number;
	atRisk: boolean;
	/** To draw off to reach the safe level: mm of level and mL (0 when safe). */
	drawOffMm: number;
	drawOffMl: number;
}

/**
 * The verdict for one jar in a store whose warmest is `maxTempC`. A store no warmer than the
 * filling temperature never expands the fluid past where it stands, so nothing is at risk there.
 */
export function airspaceVerdict(f: JarFill, maxTempC: number): AirspaceVerdict {
	const safeLevelMm =
		maxTempC <= f.fillTempC
			? f.jar.heightMm
			: airspace({ jar: f.jar, material: f.material, percentVol: f.percentVol, fillTempC: f.fillTempC, maxTempC }).maxFillLevelMm;
	// Less than a micrometre over is the floating point of the formula, not a jar at risk.
	const drawOffMm = f.levelMm - safeLevelMm > 1e-6 ? f.levelMm - safeLevelMm : 0;
	return { safeLevelMm, atRisk: drawOffMm > 0, drawOffMm, drawOffMl: drawOffMm * mlPerMm(f.jar) };
}

export interface Store {
	id: string;
	code: string;
	name: string;
	tempMaxC: number;
	/** Flammable fluid it can still take before its limit, mL; null: no limit set. */
	roomMl: number | null;
}

/**
 * The stores, cooler than the jar's own, where it would be safe as filled now: warmest first, so the
 * nearest to the jar's present conditions comes first; at most `max`. A flammable jar is offered only
 * stores with a flammable limit set that would stay within it with the jar (a store with no limit
 * set has not been assessed for flammables).
 */
export function saferStores(f: JarFill, currentMaxC: number, stores: readonly Store[], opts: { fluidMl: number; flammable: boolean; max?: number }): Store[] {
	const cooler = stores.filter((s) => s.tempMaxC < currentMaxC).sort((a, b) => b.tempMaxC - a.tempMaxC || a.code.localeCompare(b.code));
	const out: Store[] = [];
	const safeAt = new Map<number, boolean>();
	for (const s of cooler) {
		if (out.length >= (opts.max ?? 3)) break;
		if (opts.flammable && (s.roomMl === null || s.roomMl < opts.fluidMl)) continue;
		// One airspace() per distinct temperature: many stores share a thermostat setting.
		if (!safeAt.has(s.tempMaxC)) safeAt.set(s.tempMaxC, !airspaceVerdict(f, s.tempMaxC).atRisk);
		if (safeAt.get(s.tempMaxC)) out.push(s);
	}
	return out;
}
