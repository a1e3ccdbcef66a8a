import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { QueryRoot } from '../QueryRoot.tsx';
import { api, ApiError } from '../../lib/client/api.ts';
import { bodyFromView, asInput, type EditBody } from '../../lib/treatment/edit.ts';
import { RISK_STATE_LABELS, TREATMENT_STATE_LABELS } from '../../lib/treatment/vocabulary.ts';
import type { MaterialView, TreatmentView } from '../../lib/treatment/view.ts';
import type { CheckView } from '../../lib/check/view.ts';
import { CHECK_LABELS } from '../../lib/check/vocabulary.ts';
import { StepList } from './StepList.tsx';
import { RiskPanel } from './RiskPanel.tsx';
import { RiskReview } from './RiskReview.tsx';
import { shown } from './time.ts';

/**
 * One treatment: the plan and its record, the risk assessment with its sign-off, and completion.
 * The whole record is edited here and saved with its version (a stale save keeps the edits and
 * offers the saved record); what a person may do is what the server's rules allow.
 */
export default function TreatmentEditor(props: { id: string; role: string; userId: string }) {
	return (
		<QueryRoot>
			<Loader {...props} />
		</QueryRoot>
	);
}

type One = { treatment: TreatmentView };

function Loader(props: { id: string; role: string; userId: string }) {
	const t = useQuery({ queryKey: ['treatment', props.id], queryFn: () => api<One>(`/api/treatments/${props.id}`) });
	const m = useQuery({ queryKey: ['materials'], queryFn: () => api<{ materials: MaterialView[] }>('/api/treatment-materials') });
	const failed = t.error ?? m.error;
	if (failed) return <p className="notice-error" role="alert">{failed.message}</p>;
	if (!t.data || !m.data) return <p role="status">Loading the treatment…</p>;
	return <Editor key={t.data.treatment.version} t={t.data.treatment} materials={m.data.materials} {...props} />;
}

function Editor({ t, materials, role }: { t: TreatmentView; materials: MaterialView[]; role: string; userId: string }) {
	const qc = useQueryClient();
	const [body, setBody] = useState<EditBody>(() => bodyFromView(t));
	const [dirty, setDirty] = useState(false);
	const [conflict, setConflict] = useState<TreatmentView | null>(null);
	const closed = t.state === 'completed' || t.state === 'abandoned';
	const editable = role === 'conservator' && !closed;
	const riskEditable = editable && t.riskState !== 'in-review';
	const edit = (b: EditBody) => {
		setBody(b);
		setDirty(true);
	};
	const done = (data: One) => qc.setQueryData(['treatment', t.id], data);
	const save = useMutation({
		mutationFn: () => api<One>(`/api/treatments/${t.id}`, { method: 'PUT', body: { version: t.version, treatment: asInput(body) } }),
		onSuccess: done,
		onError: (err) => {
			if (err instanceof ApiError && err.status === 409) setConflict((err.body as { current: TreatmentView }).current);
		},
	});
	const act = useMutation({
		mutationFn: (a: { url: string; body: unknown }) => api<One>(a.url, { method: 'POST', body: a.body }),
		onSuccess: done,
	});
	const checks = useQuery({ queryKey: ['checks-of', t.specimen.id], queryFn: () => api<{ checks: CheckView[] }>(`/api/specimens/${t.specimen.id}/checks`) });
	const problems = act.error instanceof ApiError ? ((act.error.body as { problems?: string[] } | null)?.problems ?? []) : [];
	const hazardsAssessed = t.risk.hazards.length;
	return (
		<div className="space-y-6" data-testid="treatment">
			<header className="space-y-2">
				<p className="text-sm text-ink-600">
					<a className="font-mono text-glass-700 underline" href={`/specimens/${t.specimen.id}`}>{t.specimen.objectNumber}</a> · {t.specimen.title}
				</p>
				<h1 className="text-3xl font-semibold">{t.title}</h1>
				<p className="flex flex-wrap gap-2 text-sm">
					<span className="rounded bg-ink-100 px-2 py-0.5 font-semibold" data-testid="treatment-state">{TREATMENT_STATE_LABELS[t.state]}</span>
					<span className="rounded bg-spirit-100 px-2 py-0.5 font-semibold text-spirit-900" data-testid="risk-state">Risk assessment: {RISK_STATE_LABELS[t.riskState]}</span>
					<span className="text-ink-600">Planned by {t.author.name} · {shown(t.createdAt)}</span>
				</p>
				{t.cure.mayDisturbAt && (
					<p className={Date.parse(t.cure.mayDisturbAt) > Date.now() ? 'notice-caution' : 'notice-info'} data-testid="may-disturb">
						{Date.parse(t.cure.mayDisturbAt) > Date.now() ? 'Sealant curing: do not move the jar or top it up before ' : 'The sealant has cured; the jar may be disturbed since '}
						<strong>{shown(t.cure.mayDisturbAt)}</strong>.
					</p>
				)}
			</header>

			{conflict && (
				<div className="notice-error space-y-2" role="alert">
					<p>Someone saved this treatment while you were editing it. Your changes are still in the form.</p>
					<button type="button" className="btn-secondary" onClick={() => qc.setQueryData(['treatment', t.id], { treatment: conflict })}>Discard my changes and load the saved record</button>
				</div>
			)}

			<section className="card space-y-3" aria-labelledby="about-h">
				<h2 id="about-h" className="text-xl font-semibold">The treatment</h2>
				<label className="block">
					<span className="field-label">Title</span>
					<input className="field-input" value={body.title} disabled={!editable} onChange={(e) => edit({ ...body, title: e.target.value })} />
				</label>
				<label className="block">
					<span className="field-label">Purpose and approach</span>
					<textarea className="field-input min-h-[4rem] py-2" value={body.purpose} disabled={!editable} onChange={(e) => edit({ ...body, purpose: e.target.value })} />
				</label>
				<div className="grid gap-3 sm:grid-cols-2">
					{(['beforeCheckId', 'afterCheckId'] as const).map((k) => (
						<label key={k} className="block">
							<span className="field-label">{k === 'beforeCheckId' ? 'Before-treatment check' : 'After-treatment check'}</span>
							<select className="field-input" value={body[k] ?? ''} disabled={!editable} onChange={(e) => edit({ ...body, [k]: e.target.value || null })}>
								<option value="">— none yet —</option>
								{(checks.data?.checks ?? []).map((c) => (
									<option key={c.id} value={c.id}>
										{c.checkedOn} · {CHECK_LABELS.reason[c.reason]} · {CHECK_LABELS.state[c.state]}
									</option>
								))}
							</select>
							{(k === 'beforeCheckId' ? t.beforeCheck : t.afterCheck) && (
								<a className="mt-1 inline-block text-sm text-glass-700 underline" href={`/checks/${(k === 'beforeCheckId' ? t.beforeCheck : t.afterCheck)!.id}`}>Open the check</a>
							)}
						</label>
					))}
				</div>
			</section>

			<section className="card space-y-3" aria-labelledby="risk-h">
				<h2 id="risk-h" className="text-xl font-semibold">Risk assessment</h2>
				{t.riskState === 'signed-off' && t.riskReviewer && (
					<p className="notice-info" data-testid="signed-off">Signed off by {t.riskReviewer.name} on {shown(t.riskReviewedAt)}.{t.riskReviewComment ? ` “${t.riskReviewComment}”` : ''} Changing the hazards, their ratings or controls needs a new sign-off.</p>
				)}
				{t.riskState === 'returned' && <p className="notice-error">Returned by {t.riskReviewer?.name}: “{t.riskReviewComment}”</p>}
				{t.riskState === 'in-review' && <p className="notice-info">Waiting for sign-off since {shown(t.riskSubmittedAt)}; it cannot be changed meanwhile.</p>}
				<RiskPanel risk={body.risk} suggested={t.suggested} editable={riskEditable} onChange={(risk) => edit({ ...body, risk })} />
				{role === 'conservator' && !closed && (t.riskState === 'draft' || t.riskState === 'returned') && (
					<div className="space-y-2">
						{t.riskProblems.length > 0 && (
							<ul className="list-disc pl-5 text-sm text-ink-700" data-testid="risk-problems">
								{t.riskProblems.map((p) => <li key={p}>{p}</li>)}
							</ul>
						)}
						<button
							type="button"
							className="btn-primary"
							disabled={dirty || t.riskProblems.length > 0 || act.isPending}
							onClick={() => act.mutate({ url: `/api/treatments/${t.id}/risk-submit`, body: { version: t.version } })}
						>
							Ask for sign-off
						</button>
						{dirty && <p className="text-sm text-ink-600">Save your changes first.</p>}
					</div>
				)}
				{role === 'reviewer' && t.riskState === 'in-review' && (
					<RiskReview t={t} pending={act.isPending} onDecide={(decision, comment) => act.mutate({ url: `/api/treatments/${t.id}/risk-review`, body: { decision, comment } })} />
				)}
			</section>

			<section className="card space-y-3" aria-labelledby="plan-h">
				<h2 id="plan-h" className="text-xl font-semibold">Action plan and record</h2>
				{t.riskState !== 'signed-off' && !closed && <p className="notice-caution">Work steps can be started once a reviewer has signed off the risk assessment ({hazardsAssessed} {hazardsAssessed === 1 ? 'hazard' : 'hazards'} assessed so far).</p>}
				<StepList steps={body.steps} saved={t.steps} signedOff={t.riskState === 'signed-off'} editable={editable} people={t.people} materials={materials} warnings={t.cure.warnings} onChange={(steps) => edit({ ...body, steps })} />
			</section>

			{role === 'conservator' && !closed && (
				<section className="card space-y-2" aria-labelledby="close-h">
					<h2 id="close-h" className="text-xl font-semibold">Completing the treatment</h2>
					{t.completionProblems.length > 0 ? (
						<ul className="list-disc pl-5 text-sm text-ink-700" data-testid="completion-problems">
							{t.completionProblems.map((p) => <li key={p}>{p}</li>)}
						</ul>
					) : (
						<p className="text-sm">Every step is finished or marked not needed, and the after-treatment check is linked. Completing closes the record for good.</p>
					)}
					<button type="button" className="btn-primary" disabled={dirty || t.completionProblems.length > 0 || act.isPending} onClick={() => act.mutate({ url: `/api/treatments/${t.id}/close`, body: { version: t.version, how: 'complete' } })}>
						Complete the treatment
					</button>
				</section>
			)}

			{(act.error || save.error) && !conflict && (
				<div className="notice-error" role="alert">
					<p>{(act.error ?? save.error)!.message}</p>
					{problems.length > 1 && <ul className="list-disc pl-5">{problems.map((p) => <li key={p}>{p}</li>)}</ul>}
				</div>
			)}

			{editable && (
				<div className="sticky bottom-0 flex items-center gap-3 border-t border-ink-200 bg-paper/95 py-3">
					<button type="button" className="btn-primary" disabled={!dirty || save.isPending} onClick={() => save.mutate()}>
						{save.isPending ? 'Saving…' : 'Save the treatment'}
					</button>
					<span className="text-sm text-ink-600" role="status" data-testid="save-state">{dirty ? 'Unsaved changes' : 'All changes saved'}</span>
				</div>
			)}
		</div>
	);
}
