import { useMutation, useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { QueryRoot } from '../QueryRoot.tsx';
import { api } from '../../lib/client/api.ts';
import { RISK_STATE_LABELS, TREATMENT_STATE_LABELS } from '../../lib/treatment/vocabulary.ts';
import { BAND_LABELS, type Band } from '../../lib/treatment/risk.ts';
import type { TreatmentSummary, TreatmentView } from '../../lib/treatment/view.ts';
import type { CheckView } from '../../lib/check/view.ts';
import { CHECK_LABELS } from '../../lib/check/vocabulary.ts';
import { checkExportUrl } from '../../lib/check/exportQuery.ts';

/** On the specimen's page: its treatments, and planning a new one (conservators). */
export default function TreatmentList({ specimenId, canPlan }: { specimenId: string; canPlan: boolean }) {
	return (
		<QueryRoot>
			<List specimenId={specimenId} canPlan={canPlan} />
		</QueryRoot>
	);
}

function List({ specimenId, canPlan }: { specimenId: string; canPlan: boolean }) {
	const list = useQuery({ queryKey: ['treatments', specimenId], queryFn: () => api<{ treatments: TreatmentSummary[] }>(`/api/specimens/${specimenId}/treatments`) });
	const [planning, setPlanning] = useState(false);
	const csv = checkExportUrl({ specimen: specimenId }, 'treatments');
	return (
		<section className="card space-y-3" aria-labelledby="treatments-heading" data-testid="treatments">
			<div className="flex flex-wrap items-center justify-between gap-2">
				<h2 id="treatments-heading" className="text-lg">Treatments</h2>
				<div className="flex flex-wrap gap-2">
					<a className="btn-secondary" href={csv} download>Treatments as CSV</a>
					{canPlan && !planning && (
						<button type="button" className="btn-primary" onClick={() => setPlanning(true)}>Plan a treatment</button>
					)}
				</div>
			</div>
			{planning && <PlanForm specimenId={specimenId} onCancel={() => setPlanning(false)} />}
			{list.error && <p className="notice-error">{list.error.message}</p>}
			{list.data && list.data.treatments.length === 0 && <p className="text-sm text-ink-600">No treatment recorded. A treatment starts from a plan of the usual re-jarring steps, with a risk assessment a reviewer signs off before the work begins.</p>}
			{list.data && list.data.treatments.length > 0 && <Rows rows={list.data.treatments} />}
		</section>
	);
}

export function Rows({ rows, queue = false }: { rows: TreatmentSummary[]; queue?: boolean }) {
	return (
		<ul className="divide-y divide-ink-100 text-sm" data-testid={queue ? 'risk-queue' : 'treatment-rows'}>
			{rows.map((t) => (
				<li key={t.id} className="flex flex-wrap items-center gap-3 py-2">
					{queue && <a className="font-mono font-semibold text-glass-700 underline" href={`/specimens/${t.specimen.id}`}>{t.specimen.objectNumber}</a>}
					<a className="font-semibold text-glass-700 underline" href={`/treatments/${t.id}`}>{t.title}</a>
					<span className="rounded bg-ink-100 px-2 py-0.5 text-xs font-semibold">{TREATMENT_STATE_LABELS[t.state]}</span>
					<span className="text-ink-700">
						Risk assessment: {RISK_STATE_LABELS[t.riskState]}
						{t.worstResidual ? ` · worst residual ${BAND_LABELS[t.worstResidual as Band].toLowerCase()} (${t.hazards} ${t.hazards === 1 ? 'hazard' : 'hazards'})` : ''}
					</span>
					<span className="ml-auto text-ink-600">
						{queue ? `since ${t.riskSubmittedAt?.slice(0, 10)} · ${t.author.name}` : `${t.author.name} · ${t.updatedAt.slice(0, 10)}`}
					</span>
				</li>
			))}
		</ul>
	);
}

function PlanForm({ specimenId, onCancel }: { specimenId: string; onCancel: () => void }) {
	const [title, setTitle] = useState('Re-jar and reseal');
	const [purpose, setPurpose] = useState('');
	const [before, setBefore] = useState('');
	const checks = useQuery({ queryKey: ['checks-of', specimenId], queryFn: () => api<{ checks: CheckView[] }>(`/api/specimens/${specimenId}/checks`) });
	const open = useMutation({
		mutationFn: () => api<{ treatment: TreatmentView }>(`/api/specimens/${specimenId}/treatments`, { method: 'POST', body: { title, purpose, beforeCheckId: before || null } }),
		onSuccess: (d) => window.location.assign(`/treatments/${d.treatment.id}`),
	});
	return (
		<form
			className="space-y-3 rounded-md border border-glass-200 bg-glass-50 p-4"
			onSubmit={(e) => {
				e.preventDefault();
				open.mutate();
			}}
		>
			<label className="block">
				<span className="field-label">Title</span>
				<input className="field-input" value={title} onChange={(e) => setTitle(e.target.value)} required maxLength={200} />
			</label>
			<label className="block">
				<span className="field-label">Purpose and approach</span>
				<textarea className="field-input min-h-[3rem] py-2" value={purpose} onChange={(e) => setPurpose(e.target.value)} />
			</label>
			<label className="block">
				<span className="field-label">Before-treatment check</span>
				<select className="field-input" value={before} onChange={(e) => setBefore(e.target.value)}>
					<option value="">— none yet —</option>
					{(checks.data?.checks ?? []).map((c) => (
						<option key={c.id} value={c.id}>{c.checkedOn} · {CHECK_LABELS.reason[c.reason]} · {CHECK_LABELS.state[c.state]}</option>
					))}
				</select>
			</label>
			<p className="text-sm text-ink-700">The plan starts from the usual re-jarring and remounting steps; change, remove or add steps on the next page.</p>
			{open.error && <p className="notice-error" role="alert">{open.error.message}</p>}
			<div className="flex gap-2">
				<button type="submit" className="btn-primary" disabled={open.isPending}>Start the plan</button>
				<button type="button" className="btn-secondary" onClick={onCancel}>Cancel</button>
			</div>
		</form>
	);
}
