import { A, B, C, GLASS_EXPANSION_PER_K, T_MAX_C, T_MIN_C, type MeterGlass } from './oimlCoefficients.ts';

/**
 * Alcoholometry of ethanol–water mixtures after OIML R 22 (1975): density from mass fraction and
 * temperature, % vol ↔ mass fraction at 20 °C, and the correction of an alcohol-meter reading taken
 * away from 20 °C. Every function refuses input outside the formula's range with a RangeError that
 * says the range; none returns a number it cannot stand behind.
 */
export type { MeterGlass };

function finite(name: string, x: number): void {
	if (typeof x !== 'number' || !Number.isFinite(x)) throw new RangeError(`${name} must be a finite number.`);
}

export function checkTemperature(tempC: number): void {
	finite('The temperature', tempC);
	if (tempC < T_MIN_C || tempC > T_MAX_C) {
		throw new RangeError(`The temperature must be between ${T_MIN_C} and +${T_MAX_C} °C, the range of the OIML R 22 formula.`);
	}
}

export function checkPercentVol(name: string, v: number): void {
	finite(name, v);
	if (v < 0 || v > 100) throw new RangeError(`${name} must be between 0 and 100 % vol.`);
}

/** ρ(p, t) in kg/m³ for ethanol mass fraction p (0…1) at t °C (−20…+40). */
export function densityKgM3(massFraction: number, tempC: number): number {
	finite('The mass fraction', massFraction);
	if (massFraction < 0 || massFraction > 1) throw new RangeError('The ethanol mass fraction must be between 0 and 1.');
	checkTemperature(tempC);
	return rho(massFraction, tempC);
}

function rho(p: number, t: number): number {
	const dt = t - 20;
	let r = A[0]!;
	for (let k = 2; k <= 12; k++) r += A[k - 1]! * p ** (k - 1);
	for (let k = 1; k <= 6; k++) r += B[k - 1]! * dt ** k;
	for (let i = 1; i <= 5; i++) {
		const row = C[i - 1]!;
		for (let k = 1; k <= row.length; k++) r += row[k - 1]! * p ** k * dt ** i;
	}
	return r;
}

/** Density of pure ethanol at 20 °C from the formula itself (789.2392 kg/m³; the tables print 789.24). */
const RHO_ETHANOL_20 = rho(1, 20);

/**
 * Alcoholic strength by volume at 20 °C of a mixture of mass fraction p: q = p · ρ(p, 20) / ρ(1, 20)
 * (the definitions of % vol and % mas, Directive 76/766/EEC Annex sections 1–2).
 */
export function percentVolFromMassFraction(massFraction: number): number {
	finite('The mass fraction', massFraction);
	if (massFraction < 0 || massFraction > 1) throw new RangeError('The ethanol mass fraction must be between 0 and 1.');
	// Clamped: rounding can put a mass fraction a hair below 1 a hair above 100 % vol.
	return Math.min(100, (100 * massFraction * rho(massFraction, 20)) / RHO_ETHANOL_20);
}

/** The mass fraction whose strength at 20 °C is the given % vol (inverse of the above). */
export function massFractionFromPercentVol(percentVolAt20: number): number {
	checkPercentVol('The strength', percentVolAt20);
	return solveIncreasing((p) => (100 * p * rho(p, 20)) / RHO_ETHANOL_20, percentVolAt20);
}

/** Density in kg/m³ of a mixture of the given strength (% vol at 20 °C) at t °C. */
export function densityAtPercentVol(percentVolAt20: number, tempC: number): number {
	checkTemperature(tempC);
	return rho(massFractionFromPercentVol(percentVolAt20), tempC);
}

/** The real strength and the working behind it (densities, mass fraction). */
export interface StrengthCorrection {
	realPercentVol: number;
	/** Density the reading stands for at 20 °C, kg/m³. */
	markedDensityKgM3: number;
	/** Density of the liquid at the measured temperature, after the glass correction, kg/m³. */
	liquidDensityKgM3: number;
	massFraction: number;
	glassExpansionPerK: number;
}

/**
 * The real strength at 20 °C from an alcohol meter read at t °C. The meter is calibrated at 20 °C;
 * at t its glass has expanded by α(t − 20), so it floats at the mark of density ρ20(reading) in a
 * liquid whose density is ρ20(reading) / (1 + α(t − 20)) (OIML R 22 Tables VIIIa/b). The real
 * strength is that of the mixture having this density at t.
 */
export function correctStrength(readingPercentVol: number, tempC: number, glass: MeterGlass = 'soda-lime'): StrengthCorrection {
	checkPercentVol('The reading', readingPercentVol);
	checkTemperature(tempC);
	const alpha = GLASS_EXPANSION_PER_K[glass];
	if (alpha === undefined) throw new RangeError("The meter glass must be 'soda-lime' or 'borosilicate'.");
	const marked = rho(massFractionFromPercentVol(readingPercentVol), 20);
	const liquid = marked / (1 + alpha * (tempC - 20));
	const [heaviest, lightest] = [rho(0, tempC), rho(1, tempC)];
	if (liquid > heaviest + 1e-9 || liquid < lightest - 1e-9) {
		throw new RangeError(
			`No ethanol–water mixture reads ${readingPercentVol} % vol at ${tempC} °C; check the reading and the thermometer.`,
		);
	}
	// Density falls as the mass fraction rises, so solve on −ρ.
	const p = solveIncreasing((x) => -rho(x, tempC), -Math.min(heaviest, Math.max(lightest, liquid)));
	return {
		realPercentVol: percentVolFromMassFraction(p),
		markedDensityKgM3: marked,
		liquidDensityKgM3: liquid,
		massFraction: p,
		glassExpansionPerK: alpha,
	};
}

/** The real strength at 20 °C (% vol) from an alcohol-meter reading taken at t °C. */
export function realStrengthAt20(readingPercentVol: number, tempC: number, glass: MeterGlass = 'soda-lime'): number {
	return correctStrength(readingPercentVol, tempC, glass).realPercentVol;
}

/**
 * Volumetric thermal expansion coefficient β = −(1/ρ)·dρ/dt of a mixture, per K (central
 * difference over ±0.05 K).
 */
export function expansionCoefficientPerK(percentVolAt20: number, tempC: number): number {
	checkTemperature(tempC);
	const p = massFractionFromPercentVol(percentVolAt20);
	const h = 0.05;
	const t0 = Math.min(T_MAX_C - h, Math.max(T_MIN_C + h, tempC));
	return -(rho(p, t0 + h) - rho(p, t0 - h)) / (2 * h) / rho(p, t0);
}

/** x in [0, 1] with f(x) = y for f increasing on [0, 1] (bisection to machine precision). */
function solveIncreasing(f: (x: number) => number, y: number): number {
	let lo = 0;
	let hi = 1;
	if (y <= f(lo)) return lo;
	if (y >= f(hi)) return hi;
	for (let i = 0; i < 80 && hi - lo > 1e-15; i++) {
		const mid = (lo + hi) / 2;
		if (f(mid) < y) lo = mid;
		else hi = mid;
	}
	return (lo + hi) / 2;
}
