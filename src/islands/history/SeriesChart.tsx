import { CartesianGrid, ComposedChart, Line, ReferenceLine, ResponsiveContainer, Scatter, Tooltip, XAxis, YAxis } from 'recharts';
import type { Series } from '../../lib/history/schema.ts';

/**
 * One series over time: the readings (filled when fitted, hollow when an open check's or from before
 * the last top-up), the least-squares line, the forecast to its threshold (dashed) and the
 * threshold itself. Colours are the palette of tailwind.config.mjs, written out for SVG.
 */
const COLOUR = { reading: '#1d5350', unused: '#9badb1', trend: '#a66816', threshold: '#b3261e', grid: '#e2e8e9', text: '#324347' };
const DAY = 86_400_000;
/** Beyond this the forecast segment is cut short, so a slow jar does not squash its own readings. */
const MAX_FORECAST_YEARS = 6;

const t = (date: string) => Date.parse(`${date}T00:00:00Z`);
const year = (ms: number) => String(new Date(ms).getUTCFullYear());

export interface ChartProps {
	series: Series;
	title: string;
	/** How a value is written, e.g. "152.0 mm". */
	format: (v: number) => string;
	thresholdLabel?: string;
	/** A ceiling to show, e.g. the lid. */
	ceiling?: { value: number; label: string };
	testId: string;
}

export function SeriesChart({ series, title, format, thresholdLabel, ceiling, testId }: ChartProps) {
	const points = series.points.map((p) => ({ t: t(p.date), value: p.value, used: p.used }));
	const used = points.filter((p) => p.used);
	const other = points.filter((p) => !p.used);
	const trend = series.line ? [{ t: t(series.line.from.date), value: series.line.from.value }, { t: t(series.line.to.date), value: series.line.to.value }] : [];
	const forecast = forecastSegment(series);
	const xs = [...points.map((p) => p.t), ...forecast.map((p) => p.t)];
	const ys = [...points.map((p) => p.value), ...forecast.map((p) => p.value), ...(series.threshold === null ? [] : [series.threshold]), ...(ceiling ? [ceiling.value] : [])];
	if (!points.length) return null;
	const [x0, x1] = [Math.min(...xs) - 60 * DAY, Math.max(...xs) + 60 * DAY];
	const yTicks = niceTicks(Math.min(...ys), Math.max(...ys));
	const ticks = yearTicks(x0, x1);
	return (
		<figure className="rounded-md border border-ink-100 p-3" data-testid={testId}>
			<figcaption className="mb-2 text-sm font-semibold text-ink-800">{title}</figcaption>
			<div className="h-64 w-full">
				<ResponsiveContainer width="100%" height="100%">
					<ComposedChart margin={{ top: 8, right: 16, bottom: 4, left: 4 }}>
						<CartesianGrid stroke={COLOUR.grid} vertical={false} />
						<XAxis type="number" dataKey="t" domain={[x0, x1]} ticks={ticks} tickFormatter={year} tick={{ fill: COLOUR.text, fontSize: 12 }} allowDataOverflow />
						<YAxis type="number" dataKey="value" domain={[yTicks[0]!, yTicks.at(-1)!]} ticks={yTicks} width={48} tick={{ fill: COLOUR.text, fontSize: 12 }} />
						<Tooltip
							formatter={(v) => format(Number(v))}
							labelFormatter={(v) => new Date(Number(v)).toISOString().slice(0, 10)}
							contentStyle={{ fontSize: 12, borderColor: COLOUR.grid }}
						/>
						{ceiling && <ReferenceLine y={ceiling.value} stroke={COLOUR.text} strokeDasharray="2 3" label={{ value: ceiling.label, position: 'insideTopLeft', fill: COLOUR.text, fontSize: 11 }} />}
						{series.threshold !== null && thresholdLabel && (
							<ReferenceLine y={series.threshold} stroke={COLOUR.threshold} strokeDasharray="6 3" label={{ value: thresholdLabel, position: 'insideBottomLeft', fill: COLOUR.threshold, fontSize: 11 }} />
						)}
						{trend.length > 0 && <Line data={trend} dataKey="value" name="Fitted line" stroke={COLOUR.trend} strokeWidth={2} dot={false} isAnimationActive={false} />}
						{forecast.length > 0 && <Line data={forecast} dataKey="value" name="At this rate" stroke={COLOUR.trend} strokeWidth={2} strokeDasharray="5 4" dot={false} isAnimationActive={false} />}
						<Scatter data={used} dataKey="value" name="Fitted reading" fill={COLOUR.reading} isAnimationActive={false} />
						{other.length > 0 && <Scatter data={other} dataKey="value" name="Not fitted" fill="#ffffff" stroke={COLOUR.unused} strokeWidth={2} isAnimationActive={false} />}
					</ComposedChart>
				</ResponsiveContainer>
			</div>
			<Legend hasOther={other.length > 0} hasTrend={trend.length > 0} hasForecast={forecast.length > 0} thresholdLabel={series.threshold !== null ? thresholdLabel : undefined} />
		</figure>
	);
}

/** From the end of the fitted line towards the threshold, cut at MAX_FORECAST_YEARS. */
function forecastSegment(s: Series): { t: number; value: number }[] {
	if (!s.line || s.forecast?.kind !== 'date' || s.threshold === null) return [];
	const [t0, v0] = [t(s.line.to.date), s.line.to.value];
	const t1 = t(s.forecast.date);
	if (t1 <= t0) return [];
	const end = Math.min(t1, t0 + MAX_FORECAST_YEARS * 365.25 * DAY);
	return [{ t: t0, value: v0 }, { t: end, value: v0 + ((s.threshold - v0) * (end - t0)) / (t1 - t0) }];
}

/** Ticks at a round step (1, 2 or 5 × 10ⁿ) covering min…max with a little room, about five of them. */
function niceTicks(min: number, max: number): number[] {
	const span = max - min || Math.abs(max) || 1;
	const raw = span / 5;
	const p = 10 ** Math.floor(Math.log10(raw));
	const step = [1, 2, 5, 10].map((m) => m * p).find((s) => s >= raw)!;
	const [lo, hi] = [Math.floor((min - span * 0.04) / step) * step, Math.ceil((max + span * 0.04) / step) * step];
	const out: number[] = [];
	for (let v = lo; v <= hi + step / 2; v += step) out.push(Number(v.toFixed(10)));
	return out;
}

/** The first of January of each year in range, thinned to at most eight ticks. */
function yearTicks(from: number, to: number): number[] {
	const years: number[] = [];
	for (let y = new Date(from).getUTCFullYear() + 1; Date.UTC(y, 0, 1) <= to; y++) years.push(Date.UTC(y, 0, 1));
	const step = Math.ceil(years.length / 8) || 1;
	return years.filter((_, i) => i % step === 0);
}

function Legend({ hasOther, hasTrend, hasForecast, thresholdLabel }: { hasOther: boolean; hasTrend: boolean; hasForecast: boolean; thresholdLabel?: string }) {
	const swatch = 'inline-block h-0 w-5 border-t-2 align-middle';
	return (
		<ul className="mt-2 flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-700">
			<li><span className="mr-1 inline-block h-2.5 w-2.5 rounded-full align-middle" style={{ background: COLOUR.reading }} />Reading used for the trend</li>
			{hasOther && <li><span className="mr-1 inline-block h-2.5 w-2.5 rounded-full border-2 align-middle" style={{ borderColor: COLOUR.unused }} />Open check, or before the last top-up</li>}
			{hasTrend && <li><span className={swatch} style={{ borderColor: COLOUR.trend }} /> Fitted line</li>}
			{hasForecast && <li><span className={`${swatch} border-dashed`} style={{ borderColor: COLOUR.trend }} /> At this rate</li>}
			{thresholdLabel && <li><span className={`${swatch} border-dashed`} style={{ borderColor: COLOUR.threshold }} /> {thresholdLabel}</li>}
		</ul>
	);
}
