import type { ReactNode } from 'react';
import type { Timeline, TimelineCheck } from '../../lib/history/schema.ts';
import type { PhotoRecord } from '../../lib/photos/view.ts';
import { PHOTO_LABELS, PHOTO_VIEWS, type PhotoView } from '../../lib/photos/vocabulary.ts';
import { CHECK_LABELS, PARTS } from '../../lib/check/vocabulary.ts';
import { GradeBadge } from '../check/GradeBadge.tsx';

/**
 * Every check side by side, oldest on the left: its date, state, overall grade and priority, then
 * one row per photo view (the same view lined up across the years), the part grades and the fluid
 * readings. Photos taken outside a check get a column of their own at the end.
 */
export function AcrossChecks({ timeline, photos }: { timeline: Timeline; photos: PhotoRecord[] }) {
	const checks = timeline.checks;
	const loose = photos.filter((p) => !p.check || !checks.some((c) => c.id === p.check!.id));
	const columns: { key: string; check: TimelineCheck | null }[] = [...checks.map((c) => ({ key: c.id, check: c })), ...(loose.length ? [{ key: 'loose', check: null }] : [])];
	const photosOf = (key: string, view: PhotoView) => (key === 'loose' ? loose : photos.filter((p) => p.check?.id === key)).filter((p) => p.view === view);
	const views = PHOTO_VIEWS.filter((v) => photos.some((p) => p.view === v));
	const row = (label: string, cell: (c: TimelineCheck) => ReactNode, testId?: string) => (
		<tr key={label} className="border-t border-ink-100" data-testid={testId}>
			<th scope="row" className="sticky left-0 z-10 bg-white py-2 pr-3 text-left text-sm font-semibold text-ink-700">{label}</th>
			{columns.map(({ key, check }) => (
				<td key={key} className="px-2 py-2 align-top text-sm">{check ? cell(check) : null}</td>
			))}
		</tr>
	);
	return (
		<div className="overflow-x-auto" data-testid="across-checks">
			<table className="min-w-full border-separate border-spacing-0">
				<thead>
					<tr>
						<th scope="col" className="sticky left-0 z-10 w-36 bg-white pb-2 text-left text-sm font-semibold text-ink-600">Check</th>
						{columns.map(({ key, check }) => (
							<th key={key} scope="col" className="min-w-[9.5rem] px-2 pb-2 text-left align-bottom text-sm font-normal">
								{check ? (
									<>
										<a className="font-semibold text-glass-700 underline" href={`/checks/${check.id}`}>{check.checkedOn}</a>
										<span className="block text-xs text-ink-600">{CHECK_LABELS.reason[check.reason]}</span>
										<span className={`mt-1 inline-block rounded px-1.5 py-0.5 text-xs font-semibold ${check.state === 'approved' ? 'bg-ink-50 text-ink-700' : 'bg-spirit-100 text-spirit-900'}`}>
											{CHECK_LABELS.state[check.state]}
											{check.corrected && ' · corrected'}
										</span>
									</>
								) : (
									<span className="font-semibold text-ink-700">Not from a check</span>
								)}
							</th>
						))}
					</tr>
				</thead>
				<tbody>
					{row('Overall', (c) => <GradeBadge grade={c.overallGrade} />, 'row-overall')}
					{row('Priority', (c) => (c.priority ? CHECK_LABELS.priority[c.priority] : '—'))}
					{views.map((v) => (
						<tr key={v} className="border-t border-ink-100" data-testid={`row-view-${v}`}>
							<th scope="row" className="sticky left-0 z-10 bg-white py-2 pr-3 text-left text-sm font-semibold text-ink-700">{PHOTO_LABELS.view[v]}</th>
							{columns.map(({ key }) => (
								<td key={key} className="px-2 py-2 align-top">
									<div className="flex flex-col gap-2">
										{photosOf(key, v).map((p) => (
											<a key={p.id} href={p.urls.page} className="block w-40 overflow-hidden rounded border border-ink-100 bg-ink-50 hover:border-glass-500">
												<img src={p.urls.thumbnail} alt={`${PHOTO_LABELS.view[v]}, ${PHOTO_LABELS.stage[p.stage].toLowerCase()}, ${p.check?.checkedOn ?? p.fileName}`} loading="lazy" className="aspect-[4/3] w-full object-contain" />
												{p.stage !== 'as-found' && <span className="block px-1 text-[11px] text-ink-700">{PHOTO_LABELS.stage[p.stage]}</span>}
											</a>
										))}
									</div>
								</td>
							))}
						</tr>
					))}
					{PARTS.map((part) => row(CHECK_LABELS.part[part], (c) => (c.parts[part] ? <GradeBadge grade={c.parts[part]} /> : <span className="text-ink-500">—</span>)))}
					{row('Fluid level', (c) => (c.fluid?.levelMm == null ? '—' : `${c.fluid.levelMm.toFixed(1)} mm`), 'row-level')}
					{row('Real strength', (c) => (c.fluid?.realPercentVol == null ? '—' : `${c.fluid.realPercentVol.toFixed(1)} % vol`))}
					{row('pH', (c) => (c.fluid?.pH == null ? '—' : c.fluid.pH.toFixed(1)))}
					{row('Yellowness', (c) => (c.yellowness === null ? <span className="text-ink-500">not measured</span> : c.yellowness.toFixed(1)))}
				</tbody>
			</table>
		</div>
	);
}
