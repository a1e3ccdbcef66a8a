import { useState } from 'react';
import { Answer, CalculatorCard, NumberField, fmt, toNumber, useCalculator, useFields } from './parts.tsx';
import type { Forecast, Trend } from '../../lib/fluid/trend.ts';

interface TrendResult {
	trend: Trend;
	mlPerYear: number | null;
	forecast: Forecast | null;
}

/** Parses lines of “date level” (YYYY-MM-DD then a number), skipping blank lines. */
function parseReadings(text: string): { date: string; value: number }[] {
	return text
		.split('\n')
		.map((l) => l.trim())
		.filter(Boolean)
		.map((l) => {
			const [date = '', value = ''] = l.split(/[\s,;]+/);
			return { date, value: toNumber(value) };
		});
}

/** Level loss across dated readings, and when the fluid reaches the specimen's top. */
export function TrendCalculator() {
	const [text, setText] = useState('2019-03-12 182\n2020-04-02 180.5\n2021-03-20 178\n2022-05-11 176.5\n2023-04-18 174');
	const f = useFields({ line: '150', mlPerMm: '7.85' });
	const calc = useCalculator<unknown, TrendResult>('/api/fluid/trend');
	const d = calc.data;
	return (
		<CalculatorCard
			id="trend"
			title="Evaporation trend"
			intro="Fluid levels from successive checks, one per line: date (YYYY-MM-DD) and level in mm above the inner base. A least-squares line gives the loss per year and when the fluid reaches a line you name, such as the top of the specimen."
			state={calc}
			onCalculate={() =>
				calc.mutate({ points: parseReadings(text), unit: 'mm', lineMm: toNumber(f.values.line), mlPerMm: f.values.mlPerMm.trim() ? toNumber(f.values.mlPerMm) : null })
			}
			result={
				d && (
					<Answer
						main={d.trend.kind === 'trend' ? `Level ${d.trend.message}` : d.trend.message}
						working={
							<>
								{'r2' in d.trend && <p>{d.trend.n} readings, r² = {fmt(d.trend.r2, 3)}.</p>}
								{d.mlPerYear !== null && <p>About {fmt(Math.abs(d.mlPerYear), 0)} mL of fluid a year.</p>}
								{d.forecast?.kind === 'date' && (
									<p className="font-semibold">
										At this rate the fluid reaches {f.values.line} mm around {d.forecast.date}.
									</p>
								)}
								{d.forecast && d.forecast.kind !== 'date' && <p>{d.forecast.message}</p>}
							</>
						}
					/>
				)
			}
		>
			<div className="sm:col-span-2">
				<label className="field-label" htmlFor="trend-readings">
					Readings
				</label>
				<textarea id="trend-readings" className="field-input min-h-[8rem] py-2 font-mono text-sm" value={text} onChange={(e) => setText(e.target.value)} />
			</div>
			<NumberField label="Line that matters" unit="mm" hint="e.g. the specimen’s top" {...f.bind('line')} />
			<NumberField label="Jar’s mL per mm" unit="mL/mm" hint="From the jar calculator" {...f.bind('mlPerMm')} />
		</CalculatorCard>
	);
}
