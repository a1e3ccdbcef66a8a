import { aboutDuration, isPressing, monthYear, type Forecast } from '../../lib/history/outlook.ts';
import type { LossRow, Overview } from '../../lib/overview/schema.ts';
import { Empty, Section } from '../dashboard/parts.tsx';

/**
 * The jars losing fluid fastest (mm of level a year, since their last top-up), and those with the
 * least time before the fluid falls to the top of the specimen, each linking to the jar's history.
 */
export function FluidLoss({ loss }: { loss: Overview['fluidLoss'] }) {
	return (
		<Section title="Fluid loss" testId="overview-loss">
			<p className="-mt-2 mb-4 text-sm text-ink-700">
				From the level at each approved check since the jar was last topped up, fitted by least squares; a jar needs three readings and a clear trend to be ranked.
				{loss.considered > 0 && ` ${loss.considered.toLocaleString('en-GB')} jars are falling or already at the top of their specimen.`}
			</p>
			<div className="grid gap-6 lg:grid-cols-2">
				<LossTable title="Losing fluid fastest" rows={loss.byRate} testId="loss-by-rate" empty="No jar shows a clear fall in level over three or more approved checks." />
				<LossTable title="Least time before the specimen is exposed" rows={loss.byTimeLeft} testId="loss-by-time-left" empty="No jar with a recorded specimen top is heading for exposure at its present rate." />
			</div>
		</Section>
	);
}

/** The forecast in a few words for a table cell, and when; the whole sentence is its tooltip. */
function short(f: Forecast): [string, string | null] {
	switch (f.kind) {
		case 'date':
			return f.monthsFromToday <= 0 ? ['passed: check the jar', monthYear(f.date)] : [aboutDuration(f.monthsFromToday), monthYear(f.date)];
		case 'at-or-below':
			return ['at the specimen top now', null];
		case 'no-line':
			return ['no specimen top on record', null];
		default:
			return ['no forecast', null];
	}
}

function LossTable({ title, rows, empty, testId }: { title: string; rows: LossRow[]; empty: string; testId: string }) {
	return (
		<div data-testid={testId}>
			<h3 className="text-lg font-semibold">{title}</h3>
			{rows.length === 0 ? (
				<div className="mt-2"><Empty>{empty}</Empty></div>
			) : (
				<table className="mt-2 w-full text-left text-sm">
					<thead className="text-ink-600">
						<tr>
							<th className="py-2 pr-3 font-semibold">Specimen</th>
							<th className="whitespace-nowrap py-2 pr-3 text-right font-semibold">Per year</th>
							<th className="whitespace-nowrap py-2 font-semibold">Exposed in</th>
						</tr>
					</thead>
					<tbody>
						{rows.map((r) => (
							<tr key={r.id} className="border-t border-ink-100 align-top" data-testid="loss-row">
								<td className="py-2 pr-3">
									<a className="font-mono font-semibold text-glass-700 underline" href={`/specimens/${r.id}#history`}>{r.objectNumber}</a>
									<span className="block text-ink-700">{r.title}</span>
									<span className="block text-xs text-ink-600" title={`Level at the check of ${r.latestOn}`}>
										{r.location ?? 'No location'} · level {r.latestLevelMm.toFixed(1)}{r.specimenTopMm === null ? ' mm' : `, top ${r.specimenTopMm} mm`}
									</span>
								</td>
								<td className="whitespace-nowrap py-2 pr-3 text-right tabular-nums">
									{r.perYearMm === null ? '—' : `${Math.abs(r.perYearMm).toFixed(1)} mm`}
									{r.perYearMl !== null && <span className="block text-xs text-ink-600">{Math.round(Math.abs(r.perYearMl)).toLocaleString('en-GB')} mL</span>}
								</td>
								<td className={`py-2 ${isPressing(r.forecast) ? 'font-semibold text-alert-700' : 'text-ink-800'}`} title={r.forecast.message}>
									{short(r.forecast)[0]}
									{short(r.forecast)[1] && <span className="block text-xs font-normal text-ink-600">{short(r.forecast)[1]}</span>}
								</td>
							</tr>
						))}
					</tbody>
				</table>
			)}
		</div>
	);
}
