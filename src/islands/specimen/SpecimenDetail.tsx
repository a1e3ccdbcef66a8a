import { useQuery } from '@tanstack/react-query';
import { QueryRoot } from '../QueryRoot.tsx';
import { api } from '../../lib/client/api.ts';
import type { HistoryEntry, SpecimenView } from '../../lib/specimen/view.ts';
import { LABELS } from '../../lib/specimen/vocabulary.ts';
import { innerVolumeMl, mlPerMm } from '../../lib/fluid/jar.ts';
import { FIELD_LABELS, showValue } from '../../lib/specimen/fieldLabels.ts';
import { CHECK_LABELS } from '../../lib/check/vocabulary.ts';
import { GradeBadge } from '../check/GradeBadge.tsx';
import { CheckHistory } from './CheckHistory.tsx';

/** A specimen's record, its jar in numbers, and the trail of every change to the record. */
export default function SpecimenDetail({ id, canEdit }: { id: string; canEdit: boolean }) {
	return (
		<QueryRoot>
			<Detail id={id} canEdit={canEdit} />
		</QueryRoot>
	);
}

function Detail({ id, canEdit }: { id: string; canEdit: boolean }) {
	const q = useQuery({ queryKey: ['specimen', id], queryFn: () => api<{ specimen: SpecimenView }>(`/api/specimens/${id}`) });
	const h = useQuery({ queryKey: ['history', id], queryFn: () => api<{ history: HistoryEntry[] }>(`/api/specimens/${id}/history`) });
	if (q.isPending) return <p role="status">Loading…</p>;
	if (q.isError) return <p className="notice-error" role="alert">{q.error.message}</p>;
	const s = q.data.specimen;
	const jar = { shape: s.containerShape, widthMm: s.innerWidthMm, depthMm: s.innerDepthMm, heightMm: s.innerHeightMm };
	const dims = s.containerShape === 'cylinder' ? `⌀ ${s.innerWidthMm} × ${s.innerHeightMm} mm` : `${s.innerWidthMm} × ${s.innerDepthMm} × ${s.innerHeightMm} mm`;
	const saved = new URLSearchParams(window.location.search).has('saved');
	return (
		<div className="space-y-6">
			<div className="flex flex-wrap items-start justify-between gap-4">
				<div>
					<p className="font-mono text-sm font-semibold text-ink-700" data-testid="object-number">{s.objectNumber}</p>
					<h1 className="text-3xl font-semibold">{s.title}</h1>
					<p className="mt-1 text-ink-700">{s.department || 'No department recorded'}</p>
				</div>
				<div className="flex flex-col items-end gap-2">
					<div data-testid="current-condition" className="text-right text-sm">
						<span className="text-ink-700">Current condition </span>
						<GradeBadge grade={s.currentGrade} />
						{s.currentPriority && <span className="ml-2">· priority {CHECK_LABELS.priority[s.currentPriority].toLowerCase()}</span>}
						{s.lastCheckedOn && <span className="block text-ink-600">last approved check {s.lastCheckedOn}</span>}
					</div>
					{canEdit && <a className="btn-secondary" href={`/specimens/${s.id}/edit`}>Edit the record</a>}
				</div>
			</div>
			{saved && <p className="notice-info" role="status">Saved.</p>}
			{s.hazards.length > 0 && (
				<div className="notice-caution" data-testid="hazards">
					<p className="font-semibold">Hazards recorded for this jar</p>
					<ul className="mt-1 list-disc pl-5">
						{s.hazards.map((hz) => (
							<li key={hz.flag}>{LABELS.hazard[hz.flag]}{hz.note && ` — ${hz.note}`}</li>
						))}
					</ul>
					<p className="mt-2">Open, handle or treat it only under your organisation’s risk assessment and local regulations.</p>
				</div>
			)}
			<CheckHistory specimenId={s.id} canOpen={canEdit} />
			<div className="grid gap-6 lg:grid-cols-2">
				<section className="card" aria-labelledby="rec-h">
					<h2 id="rec-h" className="text-xl font-semibold">Record</h2>
					<dl className="mt-3 grid grid-cols-[10rem_1fr] gap-x-4 gap-y-2 text-sm">
						<Row term="Storage location" value={s.storageLocation ? `${s.storageLocation.code} — ${s.storageLocation.name}` : 'Not recorded'} />
						<Row term="Preservative" value={`${LABELS.preservative[s.preservativeKind]}${s.preservativeRecorded ? ` (recorded as “${s.preservativeRecorded}”)` : ''}`} />
						<Row term="Jar" value={`${LABELS.shape[s.containerShape]}, ${LABELS.material[s.containerMaterial].toLowerCase()}, ${dims} inside`} />
						<Row term="Closure and seal" value={`${LABELS.closure[s.closureType]}; ${LABELS.seal[s.sealType].toLowerCase()} seal`} />
						<Row term="Inner volume" value={`${Math.round(innerVolumeMl(jar)).toLocaleString('en-GB')} mL; ${mlPerMm(jar).toFixed(2)} mL per mm of level`} />
						<Row term="Top of the specimen" value={s.specimenTopMm === null ? 'Not measured' : `${s.specimenTopMm} mm above the inner base`} />
						<Row term="Next check due" value={s.nextCheckDue ?? 'Not set'} />
					</dl>
					{s.description && <p className="mt-4 whitespace-pre-line text-sm text-ink-800">{s.description}</p>}
				</section>
				<section className="card" aria-labelledby="hist-h">
					<h2 id="hist-h" className="text-xl font-semibold">Changes to this record</h2>
					{h.isPending && <p role="status">Loading…</p>}
					{h.data && (
						<ol className="mt-3 space-y-3 text-sm" data-testid="history">
							{h.data.history.map((e) => (
								<li key={e.id} className="border-l-2 border-glass-300 pl-3">
									<p>
										<time dateTime={e.at}>{new Date(e.at).toLocaleString('en-GB')}</time> · {e.actor ?? 'system'} · {ACTIONS[e.action] ?? e.action}
									</p>
									{e.changes.length > 0 && (
										<ul className="mt-1 text-ink-700">
											{e.changes.filter((c) => c.field !== 'check').map((c) => (
												<li key={c.field}>
													{FIELD_LABELS[c.field] ?? c.field}: {showValue(c.before)} → {showValue(c.after)}
												</li>
											))}
										</ul>
									)}
								</li>
							))}
						</ol>
					)}
				</section>
			</div>
		</div>
	);
}

const ACTIONS: Record<string, string> = {
	'specimen.create': 'registered the specimen',
	'specimen.update': 'edited the record',
	'specimen.import-create': 'registered it by spreadsheet import',
	'specimen.import-update': 'updated it by spreadsheet import',
	'specimen.condition': 'approved a condition check, which set the current condition',
};

function Row({ term, value }: { term: string; value: string }) {
	return (
		<>
			<dt className="font-semibold text-ink-700">{term}</dt>
			<dd>{value}</dd>
		</>
	);
}
