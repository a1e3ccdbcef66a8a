import { describe, expect, it } from 'vitest';
import { crossSectionMm2, fluidVolumeMl, innerVolumeMl, levelForVolumeMm, mlPerMm } from '../../../src/lib/fluid/jar.ts';
import { airspace } from '../../../src/lib/fluid/airspace.ts';
import { densityAtPercentVol } from '../../../src/lib/fluid/alcoholometry.ts';

/**
 * Worked examples from the area formulas of elementary geometry: circle πr², ellipse πab (a, b the
 * semi-axes), rectangle wd; prism volume = area × height; 1 mL = 1000 mm³.
 */
describe('jar volumes', () => {
	it('a cylinder 100 mm across and 200 mm high holds π·50²·200 mm³ = 1570.8 mL', () => {
		const jar = { shape: 'cylinder', widthMm: 100, heightMm: 200 } as const;
		expect(innerVolumeMl(jar)).toBeCloseTo(1570.796, 3);
		expect(mlPerMm(jar)).toBeCloseTo(7.854, 3);
	});
	it('an oval jar with axes 120 and 80 mm, 150 mm high, holds π·60·40·150 mm³ = 1131.0 mL', () => {
		expect(innerVolumeMl({ shape: 'oval', widthMm: 120, depthMm: 80, heightMm: 150 })).toBeCloseTo(1130.973, 3);
	});
	it('a rectangular jar 100 × 50 × 200 mm holds 1000 mL', () => {
		expect(innerVolumeMl({ shape: 'rectangular', widthMm: 100, depthMm: 50, heightMm: 200 })).toBe(1000);
	});
	it('gives the fluid at a level less the specimen’s displacement, and the level back from a volume', () => {
		const jar = { shape: 'rectangular', widthMm: 100, depthMm: 50, heightMm: 200 } as const;
		expect(fluidVolumeMl(jar, 150, 40)).toBeCloseTo(710, 9);
		expect(levelForVolumeMm(jar, 710, 40)).toBeCloseTo(150, 9);
	});
	it('refuses impossible jars and levels with a reason', () => {
		expect(() => crossSectionMm2({ shape: 'oval', widthMm: 80, depthMm: 120, heightMm: 100 })).toThrow(/minor axis/);
		expect(() => innerVolumeMl({ shape: 'rectangular', widthMm: 100, heightMm: 100 })).toThrow(/depth/);
		expect(() => fluidVolumeMl({ shape: 'cylinder', widthMm: 100, heightMm: 200 }, 201)).toThrow(/above the inner height/);
		expect(() => innerVolumeMl({ shape: 'cylinder', widthMm: Number.NaN, heightMm: 1 })).toThrow(RangeError);
	});
});

describe('airspace', () => {
	const jar = { shape: 'cylinder', widthMm: 100, heightMm: 200 } as const;

	it('fills the jar exactly at the warmest temperature, no more (volume balance with OIML densities)', () => {
		const r = airspace({ jar, material: 'soda-lime', percentVol: 70, fillTempC: 18, maxTempC: 30, displacementMl: 100 });
		const warm = (r.maxFillMl * densityAtPercentVol(70, 18)) / densityAtPercentVol(70, 30) + 100;
		expect(warm).toBeCloseTo(innerVolumeMl(jar) * (1 + 25e-6 * 12), 6);
		expect(r.maxFillLevelMm + r.headspaceMm).toBeCloseTo(200, 9);
	});

	it('needs about 1.15 % of the volume for 70 % spirit warming 12 K in glass, far more than for water', () => {
		const spirit = airspace({ jar, material: 'soda-lime', percentVol: 70, fillTempC: 18, maxTempC: 30 });
		const water = airspace({ jar, material: 'soda-lime', percentVol: 0, fillTempC: 18, maxTempC: 30 });
		expect(spirit.fluidExpansion).toBeCloseTo(0.0115, 4);
		// TRADE.md [S27a][S76b]: alcohol expands several times as much as water per degree.
		expect(spirit.headspaceMm / water.headspaceMm).toBeGreaterThan(3);
	});

	it('needs no airspace without warming, and refuses a cooler "warmest" temperature', () => {
		expect(airspace({ jar, material: 'borosilicate', percentVol: 70, fillTempC: 20, maxTempC: 20 }).headspaceMm).toBeCloseTo(0, 9);
		expect(() => airspace({ jar, material: 'soda-lime', percentVol: 70, fillTempC: 25, maxTempC: 20 })).toThrow(/warmest/);
		expect(() => airspace({ jar, material: 'soda-lime', percentVol: 70, fillTempC: 18, maxTempC: 45 })).toThrow(/-20 and \+40/);
	});
});
