import { describe, expect, it } from 'vitest';
import { flammableClass, jarFluidMl, jarsFluidMl, limitStatus } from '../../../src/lib/overview/inventory.ts';
import { fluidVolumeMl, innerVolumeMl } from '../../../src/lib/fluid/jar.ts';

/**
 * The flammable inventory: which jars count, how much fluid each holds at its latest level, and a
 * store's total against its limit. Volumes are checked against hand arithmetic (π r² h) and against
 * the tested jar geometry (src/lib/fluid/jar.ts); the 80 % "near" share is common practice, no
 * published source.
 */
describe('which jars a store’s flammable total counts', () => {
	it('counts ethanol, IMS and propan-2-ol as spirit, and any jar flagged flammable', () => {
		expect(flammableClass('ethanol', [])).toBe('spirit');
		expect(flammableClass('industrial-spirit', [])).toBe('spirit');
		expect(flammableClass('propan-2-ol', [])).toBe('spirit');
		expect(flammableClass('other', ['flammable-spirit'])).toBe('spirit');
	});
	it('presumes an unknown fluid flammable until tested (TRADE.md [S40b]), and leaves formalin out', () => {
		expect(flammableClass('unknown', [])).toBe('presumed');
		expect(flammableClass('formalin', ['unknown-fluid', 'formaldehyde'])).toBe('presumed');
		expect(flammableClass('formalin', ['formaldehyde'])).toBeNull();
		expect(flammableClass('other', [])).toBeNull();
	});
});

describe('the fluid in a jar', () => {
	it('holds 986.1 mL in a Ø 90 mm cylinder at 155 mm: π × 45² × 155 / 1000 = 6,361.7 mm² × 155 mm = 986.07 mL', () => {
		expect(jarFluidMl({ shape: 'cylinder', widthMm: 90, heightMm: 180 }, 155)).toBeCloseTo(986.07, 2);
	});
	it('holds 8,482.3 mL in a 240 × 150 mm oval at 300 mm: π × 120 × 75 × 300 / 1000', () => {
		expect(jarFluidMl({ shape: 'oval', widthMm: 240, depthMm: 150, heightMm: 320 }, 300)).toBeCloseTo(8482.3, 1);
	});
	it('counts a jar with no level, or a level above the inner height, as full: 150 × 60 × 240 / 1000 = 2,160 mL', () => {
		const box = { shape: 'rectangular', widthMm: 150, depthMm: 60, heightMm: 240 } as const;
		expect(jarFluidMl(box, null)).toBeCloseTo(2160, 6);
		expect(jarFluidMl(box, 250)).toBeCloseTo(innerVolumeMl(box), 6);
	});
	it('agrees with fluidVolumeMl of the jar geometry at every level in the jar', () => {
		const jar = { shape: 'oval', widthMm: 200, depthMm: 120, heightMm: 280 } as const;
		for (const level of [0, 12.5, 140, 279.9]) expect(jarFluidMl(jar, level)).toBeCloseTo(fluidVolumeMl(jar, level), 9);
	});
	it('adds jars of one size from the sum of their levels: Ø 100 mm at 100 and 150 mm = 785.4 + 1,178.1 = 1,963.5 mL', () => {
		const jar = { shape: 'cylinder', widthMm: 100, heightMm: 200 } as const;
		expect(jarsFluidMl(jar, 100 + 150)).toBeCloseTo(jarFluidMl(jar, 100) + jarFluidMl(jar, 150), 9);
		expect(jarsFluidMl(jar, 250)).toBeCloseTo(1963.5, 1);
		expect(() => jarsFluidMl(jar, -1)).toThrow(RangeError);
	});
});

describe('a store against its limit', () => {
	it('is near from 80 % of the limit: 9.0 L of 11 L is 82 %', () => {
		const r = limitStatus(9000, 11);
		expect(r.status).toBe('near');
		expect(r.share).toBeCloseTo(9 / 11, 9);
	});
	it('is near at exactly 80 % and at exactly the limit, over only beyond it', () => {
		expect(limitStatus(8800, 11).status).toBe('near');
		expect(limitStatus(8799, 11).status).toBe('within');
		expect(limitStatus(11000, 11).status).toBe('near');
		expect(limitStatus(11001, 11).status).toBe('over');
	});
	it('takes the store’s own near share', () => {
		expect(limitStatus(9000, 11, 90).status).toBe('within');
		expect(limitStatus(10000, 11, 90).status).toBe('near');
	});
	it('says when no limit is set, and refuses nonsense', () => {
		expect(limitStatus(5000, null)).toEqual({ status: 'no-limit', share: null });
		expect(() => limitStatus(1, 0)).toThrow(RangeError);
		expect(() => limitStatus(1, 10, 0)).toThrow(RangeError);
	});
});
