/**
 * Trends across checks: least-squares lines through dated readings (fluid level in mm, strength in
 * % vol), their rate per year, and when the level will reach a line that matters (the top of the
 * specimen, a warning line). With too few points, no time between them, or a slope the scatter
 * cannot tell from zero, the answer says so instead of forecasting.
 */
const DAY_MS = 86_400_000;
export const DAYS_PER_YEAR = 365.25;

export interface LinearFit {
	n: number;
	slope: number;
	intercept: number;
	/** Standard error of the slope (NaN with two points). */
	slopeStdError: number;
	r2: number;
}

/** Ordinary least squares y = intercept + slope · x. */
export function linearFit(xs: readonly number[], ys: readonly number[]): LinearFit {
	const n = xs.length;
	if (n !== ys.length) throw new RangeError('x and y must have the same number of values.');
	if (n < 2) throw new RangeError('A line needs at least two points.');
	if (![...xs, ...ys].every(Number.isFinite)) throw new RangeError('Every value must be a finite number.');
	const mx = xs.reduce((a, b) => a + b, 0) / n;
	const my = ys.reduce((a, b) => a + b, 0) / n;
	let sxx = 0;
	let sxy = 0;
	let syy = 0;
	for (let i = 0; i < n; i++) {
		const dx = xs[i]! - mx;
		const dy = ys[i]! - my;
		sxx += dx * dx;
		sxy += dx * dy;
		syy += dy * dy;
	}
	if (sxx === 0) throw new RangeError('All the points are at the same x: no line can be fitted.');
	const slope = sxy / sxx;
	const intercept = my - slope * mx;
	const sse = Math.max(0, syy - slope * sxy);
	const slopeStdError = n > 2 ? Math.sqrt(sse / (n - 2) / sxx) : Number.NaN;
	return { n, slope, intercept, slopeStdError, r2: syy === 0 ? 1 : 1 - sse / syy };
}

export interface DatedValue {
	/** ISO date (YYYY-MM-DD) or date-time. */
	date: string;
	value: number;
}

export type Trend =
	| { kind: 'too-few-points'; n: number; message: string }
	| { kind: 'no-time-span'; n: number; message: string }
	| {
			kind: 'trend' | 'no-clear-trend';
			n: number;
			/** Change per year in the value's unit (negative: falling). */
			perYear: number;
			perYearStdError: number;
			r2: number;
			/** The fitted value on the last reading's date. */
			latestFitted: number;
			message: string;
	  };

function toDays(date: string): number {
	const t = Date.parse(date.length === 10 ? `${date}T00:00:00Z` : date);
	if (!Number.isFinite(t)) throw new RangeError(`“${date}” is not a date.`);
	return t / DAY_MS;
}

/**
 * The rate of change of dated readings. At least three readings are needed to judge a trend; a
 * slope within two standard errors of zero is reported as no clear trend (about 95 % confidence
 * for many points; common practice, no published source for this use).
 */
export function trend(points: readonly DatedValue[], unit: string): Trend {
	const n = points.length;
	if (n < 3) return { kind: 'too-few-points', n, message: `At least three dated readings are needed to see a trend; there ${n === 1 ? 'is' : 'are'} ${n}.` };
	const days = points.map((p) => toDays(p.date));
	if (Math.max(...days) - Math.min(...days) < 1) {
		return { kind: 'no-time-span', n, message: 'All the readings are from the same day; a trend needs readings over time.' };
	}
	const fit = linearFit(days, points.map((p) => p.value));
	const perYear = fit.slope * DAYS_PER_YEAR;
	const perYearStdError = fit.slopeStdError * DAYS_PER_YEAR;
	const clear = Math.abs(perYear) > 2 * perYearStdError;
	const latestFitted = fit.intercept + fit.slope * Math.max(...days);
	const rate = `${perYear >= 0 ? '+' : '−'}${Math.abs(perYear).toFixed(2)} ${unit} a year`;
	return {
		kind: clear ? 'trend' : 'no-clear-trend',
		n,
		perYear,
		perYearStdError,
		r2: fit.r2,
		latestFitted,
		message: clear
			? `${rate} (± ${perYearStdError.toFixed(2)})`
			: `No clear trend: ${rate} but the scatter (± ${perYearStdError.toFixed(2)}) is as large as the change.`,
	};
}

export type Forecast =
	| { kind: 'date'; date: string; daysFromLast: number }
	| { kind: 'already-below'; message: string }
	| { kind: 'not-falling'; message: string };

/**
 * When the fitted level will reach `lineMm` (e.g. the specimen's top), from a falling trend. Only
 * a clear trend gives a date.
 */
export function forecastReach(points: readonly DatedValue[], lineMm: number): Forecast | null {
	if (!Number.isFinite(lineMm)) throw new RangeError('The line must be a finite level in mm.');
	const t = trend(points, 'mm');
	if (t.kind !== 'trend') return null;
	if (t.latestFitted <= lineMm) return { kind: 'already-below', message: 'The fluid is already at or below this line.' };
	if (t.perYear >= 0) return { kind: 'not-falling', message: 'The level is not falling.' };
	const lastDay = Math.max(...points.map((p) => toDays(p.date)));
	const daysFromLast = ((t.latestFitted - lineMm) / -t.perYear) * DAYS_PER_YEAR;
	const date = new Date((lastDay + daysFromLast) * DAY_MS).toISOString().slice(0, 10);
	return { kind: 'date', date, daysFromLast };
}
