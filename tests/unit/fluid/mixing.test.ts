import { describe, expect, it } from 'vitest';
import { dilute, topUp, waterToAdd } from '../../../src/lib/fluid/mixing.ts';

describe('water to add to bring spirit down', () => {
	it('matches the published dilution table to ±0.2 volumes (Engineers Edge, "Alcohol Dilution Reduction Table", TRADE.md [S75])', () => {
		const rows: [number, number, number][] = [
			[95, 70, 39.1],
			[95, 80, 20.9],
			[80, 70, 15.3],
		];
		for (const [from, to, water] of rows) {
			expect(Math.abs(waterToAdd({ fromPercentVol: from, toPercentVol: to, volumeMl: 100 }) - water)).toBeLessThanOrEqual(0.2);
		}
	});
	it('needs more water than V1C1 = V2C2 says, because the mix contracts', () => {
		// V1C1 = V2C2: 100 × 95 / 70 − 100 = 35.7; the real answer is about 39.1.
		expect(waterToAdd({ fromPercentVol: 95, toPercentVol: 70, volumeMl: 100 })).toBeGreaterThan(100 * (95 / 70) - 100 + 3);
	});
	it('refuses to make spirit stronger with water', () => {
		expect(() => waterToAdd({ fromPercentVol: 70, toPercentVol: 80, volumeMl: 100 })).toThrow(/cannot make spirit stronger/);
	});
});

describe('making up spirit', () => {
	const r = dilute({ stockPercentVol: 96, targetPercentVol: 70, targetVolumeMl: 1000 });

	it('takes exactly V·q_target/q_stock of stock (% vol is itself a volume of ethanol at 20 °C), but more water', () => {
		expect(r.stockMl).toBeCloseTo((1000 * 70) / 96, 6);
		expect(r.waterMl - r.naiveWaterMl).toBeGreaterThan(20);
	});
	it('loses about 2.7 % of volume on mixing (TRADE.md: up to about 4 % [S76][S34j])', () => {
		expect(r.contractionMl / 1000).toBeGreaterThan(0.02);
		expect(r.contractionMl / 1000).toBeLessThan(0.04);
	});
	it('refuses a target stronger than the stock', () => {
		expect(() => dilute({ stockPercentVol: 70, targetPercentVol: 80, targetVolumeMl: 1000 })).toThrow(/cannot be stronger/);
	});
});

describe('topping up a jar', () => {
	it('restores level and strength when adding can do it', () => {
		const r = topUp({ currentVolumeMl: 850, currentPercentVol: 66, targetVolumeMl: 1000, targetPercentVol: 70, stockPercentVol: 96 });
		expect(r.possible).toBe(true);
		if (r.possible) {
			expect(r.stockMl).toBeGreaterThan(0);
			expect(r.waterMl).toBeGreaterThan(0);
			// Ethanol by volume at 20 °C balances exactly: 850·66 + stock·96 = 1000·70.
			expect(850 * 66 + r.stockMl * 96).toBeCloseTo(1000 * 70, 6);
		}
	});
	it('says when the fluid left is already too strong, and what water alone would give', () => {
		const r = topUp({ currentVolumeMl: 800, currentPercentVol: 80, targetVolumeMl: 900, targetPercentVol: 70, stockPercentVol: 96 });
		expect(r).toMatchObject({ possible: false, reason: 'too-strong' });
		if (!r.possible) expect(r.bestPercentVol).toBeCloseTo((800 * 80) / 900, 6);
	});
	it('says when the fluid left is too weak to reach the target by adding this stock', () => {
		const r = topUp({ currentVolumeMl: 950, currentPercentVol: 40, targetVolumeMl: 1000, targetPercentVol: 70, stockPercentVol: 96 });
		expect(r).toMatchObject({ possible: false, reason: 'too-weak' });
	});
	it('says when the jar is over-full already', () => {
		const r = topUp({ currentVolumeMl: 1100, currentPercentVol: 70, targetVolumeMl: 1000, targetPercentVol: 70, stockPercentVol: 96 });
		expect(r).toMatchObject({ possible: false, reason: 'over-full' });
	});
});
