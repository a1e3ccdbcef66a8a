import { checkPercentVol, densityKgM3, massFractionFromPercentVol } from './alcoholometry.ts';

/**
 * Making and restoring spirit by mass balance. Ethanol and water contract on mixing (by up to about
 * 4 %), so volumes do not add and V1C1 = V2C2 is only a first guess; masses do add. Every volume
 * here is at 20 °C, with OIML R 22 densities; each result carries the naive figure beside it.
 */
const T = 20;
const RHO_WATER = densityKgM3(0, T);

function positiveMl(name: string, v: number): void {
	if (typeof v !== 'number' || !Number.isFinite(v) || v <= 0) throw new RangeError(`${name} must be a volume above 0 mL.`);
	if (v > 1e7) throw new RangeError(`${name} must be at most 10 000 L.`);
}

/** Mass (g per mL of volume → kg/m³ × 1e-3) and ethanol mass fraction of a strength at 20 °C. */
function spirit(percentVol: number): { p: number; rho: number } {
	const p = massFractionFromPercentVol(percentVol);
	return { p, rho: densityKgM3(p, T) };
}

export interface DiluteResult {
	stockMl: number;
	waterMl: number;
	naiveStockMl: number;
	naiveWaterMl: number;
	/**
	 * Volume lost on mixing: stock + water − target, mL. Positive at the strengths used for storage;
	 * a hair negative when diluting to a few % vol (ethanol's partial molar volume has a minimum there).
	 */
	contractionMl: number;
	densities: { stockKgM3: number; waterKgM3: number; targetKgM3: number };
}

/** Stock spirit and water that make `targetVolumeMl` at `targetPercentVol`. */
export function dilute(i: { stockPercentVol: number; targetPercentVol: number; targetVolumeMl: number }): DiluteResult {
	checkPercentVol('The stock strength', i.stockPercentVol);
	checkPercentVol('The target strength', i.targetPercentVol);
	positiveMl('The target volume', i.targetVolumeMl);
	if (i.stockPercentVol === 0) throw new RangeError('The stock must contain some ethanol.');
	if (i.targetPercentVol > i.stockPercentVol) {
		throw new RangeError('The target cannot be stronger than the stock: water only makes spirit weaker.');
	}
	const stock = spirit(i.stockPercentVol);
	const target = spirit(i.targetPercentVol);
	const totalMass = i.targetVolumeMl * target.rho; // (kg/m³)·mL, a consistent unit of mass
	const stockMass = (totalMass * target.p) / stock.p;
	const stockMl = stockMass / stock.rho;
	const waterMl = (totalMass - stockMass) / RHO_WATER;
	const naiveStockMl = (i.targetVolumeMl * i.targetPercentVol) / i.stockPercentVol;
	return {
		stockMl,
		waterMl,
		naiveStockMl,
		naiveWaterMl: i.targetVolumeMl - naiveStockMl,
		contractionMl: stockMl + waterMl - i.targetVolumeMl,
		densities: { stockKgM3: stock.rho, waterKgM3: RHO_WATER, targetKgM3: target.rho },
	};
}

/** mL of water to add to `volumeMl` of spirit at `fromPercentVol` to bring it to `toPercentVol`. */
export function waterToAdd(i: { fromPercentVol: number; toPercentVol: number; volumeMl: number }): number {
	checkPercentVol('The present strength', i.fromPercentVol);
	checkPercentVol('The wanted strength', i.toPercentVol);
	positiveMl('The volume', i.volumeMl);
	if (i.toPercentVol > i.fromPercentVol) throw new RangeError('Adding water cannot make spirit stronger.');
	if (i.toPercentVol === 0) throw new RangeError('No amount of water brings spirit to 0 % vol.');
	const from = spirit(i.fromPercentVol);
	const to = spirit(i.toPercentVol);
	const mass = i.volumeMl * from.rho;
	return (mass * (from.p / to.p) - mass) / RHO_WATER;
}

export type TopUpResult =
	| {
			possible: true;
			stockMl: number;
			waterMl: number;
			naiveStockMl: number;
			naiveWaterMl: number;
	  }
	| {
			possible: false;
			reason: 'over-full' | 'too-strong' | 'too-weak';
			message: string;
			/** What adding alone can reach at the target volume: water only, or stock only. */
			bestPercentVol: number | null;
	  };

/**
 * What to add to a jar's remaining fluid to restore its level (target volume) and strength. When
 * adding alone cannot do it, says why and what adding alone would reach.
 */
export function topUp(i: {
	currentVolumeMl: number;
	currentPercentVol: number;
	targetVolumeMl: number;
	targetPercentVol: number;
	stockPercentVol: number;
}): TopUpResult {
	positiveMl('The fluid left in the jar', i.currentVolumeMl);
	positiveMl('The full volume', i.targetVolumeMl);
	checkPercentVol('The present strength', i.currentPercentVol);
	checkPercentVol('The target strength', i.targetPercentVol);
	checkPercentVol('The stock strength', i.stockPercentVol);
	if (i.stockPercentVol === 0) throw new RangeError('The stock must contain some ethanol.');
	if (i.currentVolumeMl > i.targetVolumeMl) {
		return { possible: false, reason: 'over-full', message: 'The jar holds more than the full volume already; nothing needs adding.', bestPercentVol: null };
	}
	const now = spirit(i.currentPercentVol);
	const stock = spirit(i.stockPercentVol);
	const target = spirit(i.targetPercentVol);
	const currentMass = i.currentVolumeMl * now.rho;
	const finalMass = i.targetVolumeMl * target.rho;
	const stockMass = (finalMass * target.p - currentMass * now.p) / stock.p;
	const waterMass = finalMass - currentMass - stockMass;
	if (stockMass < -1e-9) {
		return {
			possible: false,
			reason: 'too-strong',
			message: 'The fluid in the jar is already stronger than the target would allow at full volume: water alone can restore the level, and the strength will stay above target.',
			bestPercentVol: strengthAtVolume(currentMass, currentMass * now.p, i.targetVolumeMl, 0),
		};
	}
	if (waterMass < -1e-9) {
		return {
			possible: false,
			reason: 'too-weak',
			message: 'The fluid in the jar is too weak to reach the target by adding this stock: some of it must be drawn off first, or a stronger stock used.',
			bestPercentVol: strengthAtVolume(currentMass, currentMass * now.p, i.targetVolumeMl, stock.p),
		};
	}
	const stockMl = Math.max(0, stockMass) / stock.rho;
	const waterMl = Math.max(0, waterMass) / densityKgM3(0, T);
	// The naive answer: strengths × volumes balance, volumes add.
	const addMl = i.targetVolumeMl - i.currentVolumeMl;
	const naiveStockMl = (i.targetVolumeMl * i.targetPercentVol - i.currentVolumeMl * i.currentPercentVol) / i.stockPercentVol;
	return { possible: true, stockMl, waterMl, naiveStockMl, naiveWaterMl: addMl - naiveStockMl };
}

/**
 * Strength reached by filling up to `volumeMl` with a liquid of mass fraction pAdd (0 for water),
 * starting from a mass and an ethanol mass; solved by bisection on the added mass.
 */
function strengthAtVolume(mass: number, ethanol: number, volumeMl: number, pAdd: number): number {
	let lo = 0;
	let hi = volumeMl * 1000; // far more mass than can fit
	for (let k = 0; k < 100; k++) {
		const add = (lo + hi) / 2;
		const p = (ethanol + add * pAdd) / (mass + add);
		const vol = (mass + add) / densityKgM3(Math.min(1, Math.max(0, p)), T);
		if (vol < volumeMl) lo = add;
		else hi = add;
	}
	const add = (lo + hi) / 2;
	const p = (ethanol + add * pAdd) / (mass + add);
	return (100 * p * densityKgM3(p, T)) / densityKgM3(1, T);
}
