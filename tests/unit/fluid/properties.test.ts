import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	densityAtPercentVol,
	densityKgM3,
	massFractionFromPercentVol,
	percentVolFromMassFraction,
	realStrengthAt20,
} from '../../../src/lib/fluid/alcoholometry.ts';
import { dilute, topUp, waterToAdd } from '../../../src/lib/fluid/mixing.ts';
import { airspace } from '../../../src/lib/fluid/airspace.ts';
import { fluidVolumeMl, innerVolumeMl } from '../../../src/lib/fluid/jar.ts';
import { linearFit } from '../../../src/lib/fluid/trend.ts';

/** Properties that must hold for every input, found by fast-check. */
const strength = fc.double({ min: 0, max: 100, noNaN: true });
const temp = fc.double({ min: -20, max: 40, noNaN: true });

describe('alcoholometry properties', () => {
	it('a reading at 20 °C is the real strength', () => {
		fc.assert(fc.property(strength, (x) => Math.abs(realStrengthAt20(x, 20) - x) < 1e-6));
	});
	it('% vol → mass fraction → % vol round-trips', () => {
		fc.assert(fc.property(strength, (x) => Math.abs(percentVolFromMassFraction(massFractionFromPercentVol(x)) - x) < 1e-9));
	});
	it('mass fraction → % vol → mass fraction round-trips', () => {
		fc.assert(fc.property(fc.double({ min: 0, max: 1, noNaN: true }), (p) => Math.abs(massFractionFromPercentVol(percentVolFromMassFraction(p)) - p) < 1e-9));
	});
	it('a warmer sample of the same spirit reads higher (a colder one lower)', () => {
		fc.assert(
			fc.property(fc.double({ min: 5, max: 95, noNaN: true }), fc.double({ min: 21, max: 35, noNaN: true }), (x, t) => realStrengthAt20(x, t) < x),
		);
	});
	it('density falls as strength rises, at every temperature', () => {
		fc.assert(
			fc.property(fc.double({ min: 0, max: 99, noNaN: true }), temp, (x, t) => densityAtPercentVol(x + 1, t) < densityAtPercentVol(x, t)),
		);
	});
});

describe('mass balance of mixing', () => {
	it('dilute: ethanol and total mass are conserved', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 40, max: 100, noNaN: true }),
				fc.double({ min: 0.05, max: 1, noNaN: true }),
				fc.double({ min: 10, max: 100_000, noNaN: true }),
				(stock, share, volume) => {
					const target = stock * share;
					const r = dilute({ stockPercentVol: stock, targetPercentVol: target, targetVolumeMl: volume });
					const ps = massFractionFromPercentVol(stock);
					const pt = massFractionFromPercentVol(target);
					const mStock = r.stockMl * r.densities.stockKgM3;
					const mWater = r.waterMl * r.densities.waterKgM3;
					const mTarget = volume * r.densities.targetKgM3;
					expect(Math.abs(mStock + mWater - mTarget) / mTarget).toBeLessThan(1e-9);
					expect(Math.abs(mStock * ps - mTarget * pt) / mTarget).toBeLessThan(1e-9);
					// No sign is asserted for the contraction: diluting to a few % vol expands very slightly,
					// as ethanol's partial molar volume in water has a minimum at low concentration.
				},
			),
		);
	});
	it('waterToAdd agrees with dilute', () => {
		fc.assert(
			fc.property(fc.double({ min: 50, max: 96, noNaN: true }), fc.double({ min: 0.2, max: 0.99, noNaN: true }), (from, share) => {
				const to = from * share;
				const d = dilute({ stockPercentVol: from, targetPercentVol: to, targetVolumeMl: 1000 });
				const w = waterToAdd({ fromPercentVol: from, toPercentVol: to, volumeMl: d.stockMl });
				return Math.abs(w - d.waterMl) < 1e-6;
			}),
		);
	});
});

describe('every function refuses NaN, infinities and out-of-range input with a RangeError', () => {
	/** NaN, ±∞, and finite values just outside [min, max] (either side that is bounded). */
	const nonFinite = fc.constantFrom(Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY);
	const outside = (min: number, max: number) =>
		Number.isFinite(min)
			? fc.oneof(nonFinite, fc.double({ min: -1e12, max: min, noNaN: true }).filter((x) => x < min), fc.double({ min: max, max: 1e12, noNaN: true }).filter((x) => x > max))
			: nonFinite;
	const jar = { shape: 'cylinder' as const, widthMm: 100, heightMm: 200 };
	const cases: [string, (x: number) => unknown, [number, number]][] = [
		['densityKgM3: mass fraction', (x) => densityKgM3(x, 20), [0, 1]],
		['densityKgM3: temperature', (x) => densityKgM3(0.5, x), [-20, 40]],
		['massFractionFromPercentVol', (x) => massFractionFromPercentVol(x), [0, 100]],
		['percentVolFromMassFraction', (x) => percentVolFromMassFraction(x), [0, 1]],
		['realStrengthAt20: reading', (x) => realStrengthAt20(x, 20), [0, 100]],
		['realStrengthAt20: temperature', (x) => realStrengthAt20(50, x), [-20, 40]],
		['dilute: stock strength', (x) => dilute({ stockPercentVol: x, targetPercentVol: 0, targetVolumeMl: 100 }), [0, 100]],
		['dilute: volume', (x) => dilute({ stockPercentVol: 96, targetPercentVol: 70, targetVolumeMl: x }), [0, 1e7]],
		['waterToAdd: volume', (x) => waterToAdd({ fromPercentVol: 96, toPercentVol: 70, volumeMl: x }), [0, 1e7]],
		['topUp: present strength', (x) => topUp({ currentVolumeMl: 10, currentPercentVol: x, targetVolumeMl: 20, targetPercentVol: 70, stockPercentVol: 96 }), [0, 100]],
		['innerVolumeMl: width', (x) => innerVolumeMl({ ...jar, widthMm: x }), [0, 5000]],
		['fluidVolumeMl: level', (x) => fluidVolumeMl(jar, x), [0, 200]],
		['airspace: warmest temperature', (x) => airspace({ jar, material: 'soda-lime', percentVol: 70, fillTempC: -20, maxTempC: x }), [-20, 40]],
		['linearFit: a value', (x) => linearFit([1, 2, 3], [1, 2, x]), [Number.NEGATIVE_INFINITY, Number.POSITIVE_INFINITY]],
	];
	it.each(cases)('%s', (_name, call, [min, max]) => {
		fc.assert(
			fc.property(outside(min, max), (x) => {
				expect(() => call(x)).toThrow(RangeError);
			}),
		);
	});
});
