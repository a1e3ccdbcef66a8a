import { describe, expect, it } from 'vitest';
import { forecastReach, linearFit, trend } from '../../../src/lib/fluid/trend.ts';

describe('least-squares line', () => {
	it('reproduces Anscombe’s data set I: y = 3.00 + 0.500 x, r² = 0.67, slope standard error 0.118', () => {
		// F. J. Anscombe (1973), "Graphs in Statistical Analysis", The American Statistician 27(1): 17–21.
		const x = [10, 8, 13, 9, 11, 14, 6, 4, 12, 7, 5];
		const y = [8.04, 6.95, 7.58, 8.81, 8.33, 9.96, 7.24, 4.26, 10.84, 4.82, 5.68];
		const fit = linearFit(x, y);
		expect(fit.slope).toBeCloseTo(0.5, 3);
		expect(fit.intercept).toBeCloseTo(3.0, 2);
		expect(fit.r2).toBeCloseTo(0.67, 2);
		expect(fit.slopeStdError).toBeCloseTo(0.118, 3);
	});
	it('refuses fewer than two points, all-equal x and non-finite values', () => {
		expect(() => linearFit([1], [1])).toThrow(/two points/);
		expect(() => linearFit([2, 2, 2], [1, 2, 3])).toThrow(/same x/);
		expect(() => linearFit([1, 2], [1, Number.NaN])).toThrow(/finite/);
	});
});

describe('level trend across checks', () => {
	// A jar losing exactly 2 mm a year, read every year (one year = 365.25 days).
	const exact = [0, 1, 2, 3, 4].map((k) => ({
		date: new Date(Date.UTC(2020, 0, 1) + k * 365.25 * 86_400_000).toISOString().slice(0, 10),
		value: 180 - 2 * k,
	}));

	it('recovers a known slope of −2 mm a year', () => {
		const t = trend(exact, 'mm');
		expect(t.kind).toBe('trend');
		if (t.kind === 'trend') expect(t.perYear).toBeCloseTo(-2, 2);
	});

	it('forecasts when the level reaches a line: 172 mm is 4 mm below the last fitted 172+4, two years on', () => {
		const f = forecastReach(exact, 168);
		expect(f?.kind).toBe('date');
		if (f?.kind === 'date') expect(Math.abs(f.daysFromLast - 2 * 365.25)).toBeLessThan(2);
		expect(forecastReach(exact, 190)?.kind).toBe('already-below');
	});

	it('answers honestly with too few points, one day only, or scatter larger than the change', () => {
		expect(trend(exact.slice(0, 2), 'mm').kind).toBe('too-few-points');
		expect(trend(exact.map((p) => ({ ...p, date: '2024-01-01' })), 'mm').kind).toBe('no-time-span');
		const noisy = [
			{ date: '2020-01-01', value: 180 },
			{ date: '2021-01-01', value: 176 },
			{ date: '2022-01-01', value: 181 },
			{ date: '2023-01-01', value: 177 },
		];
		expect(trend(noisy, 'mm').kind).toBe('no-clear-trend');
		expect(forecastReach(noisy, 150)).toBeNull();
	});

	it('refuses dates it cannot read', () => {
		expect(() => trend([...exact, { date: 'last spring', value: 170 }], 'mm')).toThrow(/not a date/);
	});
});
