import { DAYS_PER_YEAR, forecastReach, trend, type DatedValue, type Trend } from '../fluid/trend.ts';

/**
 * What a specimen's dated fluid readings say about where it is heading: the readings since the jar
 * was last topped up, their trend (src/lib/fluid/trend.ts), the fitted line to draw, and when the
 * level would reach the top of the specimen. Shared by the specimen history and the collection
 * overview, so both say the same thing about a jar.
 */

/**
 * A level that rose by more than this between two checks means the jar was topped up (or refilled)
 * in between: the readings before it belong to another fill and are left out of the trend. A steel
 * rule read to the half millimetre cannot rise 2 mm by error alone (common practice, no published
 * source).
 */
export const TOP_UP_RISE_MM = 2;

const DAY_MS = 86_400_000;
/** Average month, for "in about N months" (365.25 / 12 days). */
export const DAYS_PER_MONTH = DAYS_PER_YEAR / 12;

const dayOf = (date: string) => Date.parse(`${date.slice(0, 10)}T00:00:00Z`) / DAY_MS;
const isoDay = (day: number) => new Date(day * DAY_MS).toISOString().slice(0, 10);

/**
 * The date of the first level reading after the last top-up (readings oldest first): trends start
 * there. Null when there are no readings.
 */
export function fillStartedOn(levels: readonly DatedValue[], riseMm = TOP_UP_RISE_MM): string | null {
	if (!levels.length) return null;
	let start = 0;
	for (let i = 1; i < levels.length; i++) if (levels[i]!.value - levels[i - 1]!.value > riseMm) start = i;
	return levels[start]!.date;
}

/** The points on or after a date (all of them when the date is null). */
export const since = <T extends DatedValue>(points: readonly T[], date: string | null): T[] => (date === null ? [...points] : points.filter((p) => p.date >= date));

export interface FittedLine {
	from: DatedValue;
	to: DatedValue;
}

/** The least-squares line across the points a trend was fitted to, for drawing. Null without a line. */
export function fittedLine(points: readonly DatedValue[], t: Trend): FittedLine | null {
	if (t.kind !== 'trend' && t.kind !== 'no-clear-trend') return null;
	const days = points.map((p) => dayOf(p.date));
	const [first, last] = [Math.min(...days), Math.max(...days)];
	const at = (day: number) => t.latestFitted + (t.perYear * (day - last)) / DAYS_PER_YEAR;
	return { from: { date: isoDay(first), value: at(first) }, to: { date: isoDay(last), value: at(last) } };
}

export type Forecast =
	| { kind: 'no-line'; message: string }
	| { kind: 'at-or-below'; message: string }
	| { kind: 'no-trend'; message: string }
	| { kind: 'not-falling'; message: string }
	| {
			kind: 'date';
			/** When the fitted line reaches the threshold (YYYY-MM-DD). */
			date: string;
			/** Months from today (negative: the line has passed it already). */
			monthsFromToday: number;
			message: string;
	  };

/** A line a falling series must not reach, and how to speak of it. */
export interface Threshold {
	value: number | null;
	/** "the fluid reaches the top of the specimen" */
	reaches: string;
	/** "the fluid would have reached the top of the specimen" */
	reached: string;
	/** "the fluid stood at or below the top of the specimen" */
	atOrBelow: string;
	/** Said when `value` is null. */
	missing: string;
	/** Why the line matters, said after a forecast. */
	why?: string;
}

/** The top of the specimen: once the fluid falls to it, the specimen is exposed. */
export const specimenTop = (mm: number | null): Threshold => ({
	value: mm,
	reaches: 'the fluid reaches the top of the specimen',
	reached: 'the fluid would have reached the top of the specimen',
	atOrBelow: 'the fluid stood at or below the top of the specimen',
	missing: 'The record gives no height for the top of the specimen, so no forecast of when it would be exposed.',
});

/**
 * 65 % vol: below about this strength, mould and decay become a risk in an ethanol jar (TRADE.md,
 * [S4] UCL Culture, "Project Pickle"). Only for fluids an alcohol meter reads true.
 */
export const WEAK_SPIRIT_PERCENT_VOL = 65;
export const weakSpirit: Threshold = {
	value: WEAK_SPIRIT_PERCENT_VOL,
	reaches: `the strength falls to ${WEAK_SPIRIT_PERCENT_VOL} % vol`,
	reached: `the strength would have fallen to ${WEAK_SPIRIT_PERCENT_VOL} % vol`,
	atOrBelow: `the strength was at or below ${WEAK_SPIRIT_PERCENT_VOL} % vol`,
	missing: '',
	why: `Below about ${WEAK_SPIRIT_PERCENT_VOL} % vol mould and decay become a risk.`,
};

const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];
/** "August 2029" for 2029-08-07. */
export const monthYear = (date: string) => `${MONTHS[Number(date.slice(5, 7)) - 1]} ${date.slice(0, 4)}`;

/** "about 7 months", "about 4 years": months up to three years, then years, as people say it. */
export function aboutDuration(months: number): string {
	const m = Math.max(0, months);
	if (m < 1) return 'less than a month';
	if (m < 36) {
		const n = Math.round(m);
		return `about ${n} month${n === 1 ? '' : 's'}`;
	}
	return `about ${Math.round(m / 12)} years`;
}

export interface Outlook {
	/** The readings the trend was fitted to. */
	used: DatedValue[];
	trend: Trend;
	line: FittedLine | null;
	/** Null for a series with no threshold to reach. */
	forecast: Forecast | null;
}

/**
 * The outlook of one series (readings oldest first, already limited to the current fill): its trend,
 * the fitted line, and when a falling line would reach the threshold, counted from today.
 */
export function outlook(used: readonly DatedValue[], threshold: Threshold | null, unit: string, today: string): Outlook {
	const t = trend(used, unit);
	return { used: [...used], trend: t, line: fittedLine(used, t), forecast: threshold ? forecastFor(used, t, threshold, today) : null };
}

/** The level outlook of one jar from all its level readings: the trend since the last top-up, against the specimen's top. */
export function levelOutlook(levels: readonly DatedValue[], opts: { specimenTopMm: number | null; today: string }): Outlook & { fillStartedOn: string | null; forecast: Forecast } {
	const start = fillStartedOn(levels);
	const o = outlook(since(levels, start), specimenTop(opts.specimenTopMm), 'mm', opts.today);
	// A threshold was given, so there is a forecast.
	return { ...o, fillStartedOn: start, forecast: o.forecast! };
}

function forecastFor(used: readonly DatedValue[], t: Trend, threshold: Threshold, today: string): Forecast {
	const latest = used.at(-1);
	const line = threshold.value;
	if (line === null) return { kind: 'no-line', message: threshold.missing };
	const why = threshold.why ? ` ${threshold.why}` : '';
	if (latest && latest.value <= line) return { kind: 'at-or-below', message: `At the last check (${latest.date}) ${threshold.atOrBelow}.${why}` };
	if (t.kind !== 'trend') return { kind: 'no-trend', message: `No forecast: ${lowerFirst(t.message)}` };
	const reach = t.perYear < 0 ? forecastReach(used, line) : null;
	if (!reach || reach.kind === 'not-falling') return { kind: 'not-falling', message: 'Not falling, so not heading for the line at this rate.' };
	if (reach.kind === 'already-below') {
		return {
			kind: 'date',
			date: latest!.date,
			monthsFromToday: (dayOf(latest!.date) - dayOf(today)) / DAYS_PER_MONTH,
			message: `On the fitted line ${threshold.reached} already: check the jar.${why}`,
		};
	}
	const monthsFromToday = (dayOf(reach.date) - dayOf(today)) / DAYS_PER_MONTH;
	const message =
		monthsFromToday <= 0
			? `At this rate ${threshold.reached} around ${monthYear(reach.date)}: check the jar.${why}`
			: `At this rate ${threshold.reaches} in ${aboutDuration(monthsFromToday)} (around ${monthYear(reach.date)}).${why}`;
	return { kind: 'date', date: reach.date, monthsFromToday, message };
}

const lowerFirst = (s: string) => s.charAt(0).toLowerCase() + s.slice(1);

/**
 * A forecast to show with emphasis: the line is reached already, or will be within a year, about
 * the longest interval between checks of a jar in poor condition (common practice, no published source).
 */
export const isPressing = (f: Forecast | null): boolean => f?.kind === 'at-or-below' || (f?.kind === 'date' && f.monthsFromToday < 12);
