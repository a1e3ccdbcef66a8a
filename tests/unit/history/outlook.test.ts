import { describe, expect, it } from 'vitest';
import { aboutDuration, fillStartedOn, fittedLine, isPressing, levelOutlook, outlook, since, weakSpirit } from '../../../src/lib/history/outlook.ts';
import { trend } from '../../../src/lib/fluid/trend.ts';

/**
 * The outlook of a jar's readings, built on the tested least-squares trend (src/lib/fluid/trend.ts).
 * Worked cases by hand; the 2 mm top-up rise and the one-year "pressing" line are common practice,
 * no published source.
 */
const DAY = 86_400_000;
const yearly = (values: number[], from = Date.UTC(2020, 0, 1)) =>
	values.map((value, k) => ({ date: new Date(from + k * 365.25 * DAY).toISOString().slice(0, 10), value }));
// Exactly 2 mm a year lost, read once a year: 180, 178, 176, 174, 172.
const falling = yearly([180, 178, 176, 174, 172]);
const lastDate = falling.at(-1)!.date;

describe('readings since the last top-up', () => {
	it('starts after a rise of more than 2 mm between checks', () => {
		const levels = yearly([180, 178, 176, 185, 183, 181]);
		expect(fillStartedOn(levels)).toBe(levels[3]!.date);
		expect(since(levels, fillStartedOn(levels)).map((p) => p.value)).toEqual([185, 183, 181]);
	});
	it('keeps every reading when the level never rose by more than 2 mm (a reading error of a steel rule)', () => {
		const levels = yearly([180, 182, 179, 181]);
		expect(fillStartedOn(levels)).toBe(levels[0]!.date);
		expect(fillStartedOn([])).toBeNull();
	});
});

describe('the fitted line', () => {
	it('runs from 180 mm at the first reading to 172 mm at the last for an exact fall of 2 mm a year', () => {
		const line = fittedLine(falling, trend(falling, 'mm'))!;
		expect(line.from.date).toBe('2020-01-01');
		// Dates fall on whole days, so the points are a few hours off an exact line: to 0.01 mm.
		expect(line.from.value).toBeCloseTo(180, 2);
		expect(line.to).toEqual({ date: lastDate, value: expect.closeTo(172, 2) });
	});
	it('is absent with too few readings', () => {
		expect(fittedLine(falling.slice(0, 2), trend(falling.slice(0, 2), 'mm'))).toBeNull();
	});
});

describe('when the fluid reaches the top of the specimen', () => {
	it('forecasts 24 months from the last reading: (172 − 168) mm ÷ 2 mm a year = 2 years, 730.5 days after 1 January 2024', () => {
		const o = levelOutlook(falling, { specimenTopMm: 168, today: lastDate });
		expect(o.trend.kind).toBe('trend');
		expect(o.forecast.kind).toBe('date');
		if (o.forecast.kind !== 'date') return;
		expect(o.forecast.monthsFromToday).toBeCloseTo(24, 0);
		expect(o.forecast.message).toBe('At this rate the fluid reaches the top of the specimen in about 24 months (around December 2025).');
	});
	it('counts the months from today, and says when the line has passed already', () => {
		const later = levelOutlook(falling, { specimenTopMm: 168, today: '2025-01-01' });
		expect(later.forecast.kind === 'date' && Math.round(later.forecast.monthsFromToday)).toBe(12);
		const late = levelOutlook(falling, { specimenTopMm: 168, today: '2026-06-01' });
		expect(late.forecast.message).toBe('At this rate the fluid would have reached the top of the specimen around December 2025: check the jar.');
	});
	it('fits only the readings since the last top-up', () => {
		const topped = [...yearly([160, 150, 140]), ...yearly([180, 178, 176, 174, 172], Date.UTC(2023, 0, 1))];
		const o = levelOutlook(topped, { specimenTopMm: 168, today: '2027-01-01' });
		expect(o.fillStartedOn).toBe('2023-01-01');
		expect(o.used).toHaveLength(5);
		expect(o.trend.kind === 'trend' && o.trend.perYear).toBeCloseTo(-2, 3);
	});
	it('answers honestly: no specimen top, already at it, too few readings, not falling', () => {
		expect(levelOutlook(falling, { specimenTopMm: null, today: lastDate }).forecast.kind).toBe('no-line');
		expect(levelOutlook(falling, { specimenTopMm: 172, today: lastDate }).forecast.kind).toBe('at-or-below');
		const two = levelOutlook(falling.slice(0, 2), { specimenTopMm: 100, today: lastDate }).forecast;
		expect(two).toEqual({ kind: 'no-trend', message: 'No forecast: at least three dated readings are needed to see a trend; there are 2.' });
		expect(levelOutlook(yearly([170, 171, 172]), { specimenTopMm: 100, today: lastDate }).forecast.kind).toBe('not-falling');
	});
});

describe('when spirit weakens to 65 % vol', () => {
	it('forecasts from a strength falling 0.5 % vol a year: (67 − 65) ÷ 0.5 = 4 years', () => {
		const o = outlook(yearly([69, 68.5, 68, 67.5, 67]), weakSpirit, '% vol', '2024-01-01');
		expect(o.forecast?.kind === 'date' && Math.round(o.forecast.monthsFromToday)).toBe(48);
		expect(o.forecast?.message).toMatch(/^At this rate the strength falls to 65 % vol in about 4 years \(around .+\)\. Below about 65 % vol mould and decay become a risk\.$/);
	});
	it('has no forecast for a series without a threshold', () => {
		expect(outlook(falling, null, 'YI', lastDate).forecast).toBeNull();
	});
});

describe('wording and emphasis', () => {
	it('speaks in months up to three years, then in years', () => {
		expect(aboutDuration(0.4)).toBe('less than a month');
		expect(aboutDuration(1.2)).toBe('about 1 month');
		expect(aboutDuration(35.4)).toBe('about 35 months');
		expect(aboutDuration(36)).toBe('about 3 years');
		expect(aboutDuration(150)).toBe('about 13 years');
	});
	it('presses a forecast within a year, or a line reached', () => {
		expect(isPressing({ kind: 'date', date: '2027-01-01', monthsFromToday: 11, message: '' })).toBe(true);
		expect(isPressing({ kind: 'date', date: '2028-01-01', monthsFromToday: 13, message: '' })).toBe(false);
		expect(isPressing({ kind: 'at-or-below', message: '' })).toBe(true);
		expect(isPressing(null)).toBe(false);
	});
});
