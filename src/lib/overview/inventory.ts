import { fluidVolumeMl, innerVolumeMl, mlPerMm, type Jar } from '../fluid/jar.ts';
import type { HazardFlag, PreservativeKind } from '../specimen/vocabulary.ts';

/**
 * The flammable inventory of a store: how much spirit its jars hold, against the limit the
 * organisation set for the store. Fire codes and building allowances are local; this is arithmetic
 * on the record, not a statement that a store is compliant.
 */

/** Preservatives that are flammable spirit (TRADE.md: ethanol, IMS and propan-2-ol all flash below 25 °C). */
export const FLAMMABLE_KINDS = ['ethanol', 'industrial-spirit', 'propan-2-ol'] as const satisfies readonly PreservativeKind[];

/**
 * How a jar counts: `spirit` when its preservative is flammable or the record flags flammable
 * spirit; `presumed` when the fluid is unknown, since an unknown fluid is presumed toxic and
 * flammable until tested (TRADE.md [S40b]); null otherwise (formalin, glycerol mixtures, …).
 */
export type FlammableClass = 'spirit' | 'presumed';

export function flammableClass(kind: PreservativeKind, flags: readonly HazardFlag[]): FlammableClass | null {
	if ((FLAMMABLE_KINDS as readonly string[]).includes(kind) || flags.includes('flammable-spirit')) return 'spirit';
	if (kind === 'unknown' || flags.includes('unknown-fluid')) return 'presumed';
	return null;
}

/**
 * The fluid in a jar at its latest level, mL. Without a level on record the jar counts as full, and
 * a level recorded above the inner height counts as full too: for a fire load, too much is the safe
 * error. The specimen's own volume is not subtracted, for the same reason.
 */
export function jarFluidMl(jar: Jar, levelMm: number | null): number {
	if (levelMm === null || levelMm >= jar.heightMm) return innerVolumeMl(jar);
	return fluidVolumeMl(jar, Math.max(0, levelMm));
}

/**
 * The fluid in several jars of one size, from the sum of their levels (each already limited to the
 * inner height, full where unknown): volume is linear in the level, so this equals the sum of
 * jarFluidMl over the jars. The server adds the levels in SQL and passes the sum here.
 */
export function jarsFluidMl(jar: Jar, levelSumMm: number): number {
	if (!Number.isFinite(levelSumMm) || levelSumMm < 0) throw new RangeError('The sum of the levels must be 0 mm or more.');
	return mlPerMm(jar) * levelSumMm;
}

/**
 * 80 %: the share of its limit at which a store counts as near it, unless the administrator sets
 * another (common practice, no published source).
 */
export const DEFAULT_NEAR_LIMIT_PERCENT = 80;

export type LimitStatus = 'over' | 'near' | 'within' | 'no-limit';

/** A store's spirit against its limit: over it, near it (at or above the near share), or within. */
export function limitStatus(totalMl: number, limitL: number | null, nearPercent = DEFAULT_NEAR_LIMIT_PERCENT): { status: LimitStatus; share: number | null } {
	if (limitL === null) return { status: 'no-limit', share: null };
	if (!(limitL > 0)) throw new RangeError('A flammable limit must be more than 0 litres.');
	if (!(nearPercent > 0 && nearPercent <= 100)) throw new RangeError('The near threshold must be between 1 and 100 %.');
	const share = totalMl / 1000 / limitL;
	return { status: share > 1 ? 'over' : share >= nearPercent / 100 ? 'near' : 'within', share };
}

/** The standing caution wherever spirit volumes are shown. */
export const FLAMMABLE_CAUTION =
	'Spirit is flammable: ethanol–water mixtures and propan-2-ol give off flammable vapour at ordinary room temperature. These totals are estimates from the record (jar size and the latest fluid level), not a measurement. Fire codes and building allowances are local: the limits here are your organisation’s own figures, and local regulations, your fire risk assessment and qualified practice govern how much spirit a store may hold and how it is kept.';
