import { useQuery } from '@tanstack/react-query';
import { QueryRoot } from '../QueryRoot.tsx';
import { api } from '../../lib/client/api.ts';
import type { Series, Timeline } from '../../lib/history/schema.ts';
import { isPressing, WEAK_SPIRIT_PERCENT_VOL } from '../../lib/history/outlook.ts';
import type { PhotoRecord } from '../../lib/photos/view.ts';
import { AcrossChecks } from './AcrossChecks.tsx';
import { SeriesChart } from './SeriesChart.tsx';

/**
 * A specimen's visual history: its checks lined up with their photographs, grades and readings, and
 * charts of the fluid level and strength with their trends and what they foretell.
 */
export default function SpecimenHistory({ specimenId }: { specimenId: string }) {
	return (
		<QueryRoot>
			<History specimenId={specimenId} />
		</QueryRoot>
	);
}

function History({ specimenId }: { specimenId: string }) {
	const q = useQuery({ queryKey: ['timeline', specimenId], queryFn: () => api<Timeline>(`/api/specimens/${specimenId}/timeline`) });
	const photos = useQuery({ queryKey: ['photos', 'specimen', specimenId], queryFn: () => api<{ photos: PhotoRecord[] }>(`/api/specimens/${specimenId}/photos`) });
	return (
		<section id="history" className="card space-y-5" aria-labelledby="history-h" data-testid="specimen-history">
			<div>
				<h2 id="history-h" className="text-xl font-semibold">History</h2>
				<p className="mt-1 text-sm text-ink-700">Every condition check side by side, oldest first, with the same photo views lined up across the years.</p>
			</div>
			{q.isPending && <p role="status">Loading the history…</p>}
			{q.isError && <p className="notice-error" role="alert">The history could not be loaded: {q.error.message}</p>}
			{q.data && q.data.checks.length === 0 && <p className="rounded-md border border-dashed border-ink-200 bg-paper px-4 py-6">No condition check yet: the history starts with the first one.</p>}
			{q.data && q.data.checks.length > 0 && <Body t={q.data} photos={photos.data?.photos ?? []} />}
		</section>
	);
}

const mm = (v: number) => `${v.toFixed(1)} mm`;
const pv = (v: number) => `${v.toFixed(1)} % vol`;

function Body({ t, photos }: { t: Timeline; photos: PhotoRecord[] }) {
	const { level, strength, yellowness } = t.series;
	return (
		<>
			<AcrossChecks timeline={t} photos={photos} />
			<div className="grid gap-4 lg:grid-cols-2">
				<div className="space-y-2">
					<h3 className="text-lg font-semibold">Fluid level</h3>
					<TrendSummary series={level} perYear={(v) => `${signed(v, 2)} mm a year${level.mlPerYear === null ? '' : ` (${signed(level.mlPerYear, 0)} mL)`}`} />
					<SeriesChart
						series={level}
						title="Level above the inner base (mm)"
						format={mm}
						thresholdLabel={t.specimen.specimenTopMm === null ? undefined : `Top of the specimen, ${t.specimen.specimenTopMm} mm`}
						ceiling={{ value: t.specimen.innerHeightMm, label: `Lid, ${t.specimen.innerHeightMm} mm` }}
						testId="chart-level"
					/>
				</div>
				<div className="space-y-2">
					<h3 className="text-lg font-semibold">Real strength</h3>
					{strength.points.length === 0 ? (
						<p className="text-sm text-ink-700" data-testid="no-strength">No strength readings: an alcohol meter reads ethanol–water mixtures only, so propan-2-ol, formalin and unknown fluids are not read with it.</p>
					) : (
						<>
							<TrendSummary series={strength} perYear={(v) => `${signed(v, 2)} % vol a year`} />
							<SeriesChart series={strength} title="Real strength at 20 °C (% vol)" format={pv} thresholdLabel={strength.threshold === null ? undefined : `${WEAK_SPIRIT_PERCENT_VOL} % vol`} testId="chart-strength" />
						</>
					)}
				</div>
			</div>
			<div className="text-sm text-ink-700">
				<h3 className="text-lg font-semibold text-ink-900">Fluid colour</h3>
				{yellowness.points.length === 0 ? (
					<p data-testid="no-yellowness">No yellowness measured: it is taken from each check’s front photograph, white-balanced on its grey card, inside a fluid mark or the clear fluid between the fluid line and the specimen’s top.</p>
				) : (
					<SeriesChart series={yellowness} title="Yellowness index (ASTM E313)" format={(v) => v.toFixed(1)} testId="chart-yellowness" />
				)}
			</div>
			<p className="text-xs text-ink-600">
				Trends use approved checks only{t.fillStartedOn ? `, from ${t.fillStartedOn}` : ''}: a rise of more than 2 mm between checks is taken as a top-up, and the readings before it belong to the earlier fill. A forecast follows the fitted line; a seal that fails faster, or a top-up, changes it.
			</p>
		</>
	);
}

/** The rate and what it leads to, in words, beside each chart. */
function TrendSummary({ series, perYear }: { series: Series; perYear: (v: number) => string }) {
	const tr = series.trend;
	const f = series.forecast;
	const urgent = isPressing(f);
	return (
		<div className="space-y-1 text-sm" data-testid={`summary-${series.unit === 'mm' ? 'level' : 'strength'}`}>
			<p>{tr.kind === 'trend' ? <><span className="font-semibold">{perYear(tr.perYear)}</span> since {series.line?.from.date} ({tr.n} readings)</> : tr.message}</p>
			{f && <p className={urgent ? 'notice-caution' : 'text-ink-700'}>{f.message}</p>}
		</div>
	);
}

const signed = (v: number, digits: number) => `${v > 0 ? '+' : v < 0 ? '−' : '±'}${Math.abs(v).toFixed(digits)}`;
