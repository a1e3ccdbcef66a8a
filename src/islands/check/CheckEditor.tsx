import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Controller, useForm, type Path } from 'react-hook-form';
import { QueryRoot } from '../QueryRoot.tsx';
import { api, ApiError } from '../../lib/client/api.ts';
import type { CheckView } from '../../lib/check/view.ts';
import { CheckBodySchema, type CheckBodyInput } from '../../lib/check/schema.ts';
import { CHECK_LABELS, PARTS, PRIORITIES, REASONS, type Grade, type Part, type Priority } from '../../lib/check/vocabulary.ts';
import { suggestedPriority, worstGrade } from '../../lib/check/grading.ts';
import { LABELS } from '../../lib/specimen/vocabulary.ts';
import { PartsGrid, type PartsValue } from './PartsGrid.tsx';
import { FluidFields, emptyFluid, type FluidValue } from './FluidFields.tsx';
import { ReviewPanel } from './ReviewPanel.tsx';
import { GradeBadge } from './GradeBadge.tsx';
import { CheckTrail } from './CheckTrail.tsx';

/**
 * One condition check: graded part by part, with the fluid readings and the overall grade and
 * priority that follow; saved as a draft, submitted, and reviewed. What a person may do here is what
 * the server's workflow allows; the page only hides the rest.
 */
export default function CheckEditor({ id, role, userId }: { id: string; role: string; userId: string }) {
	return (
		<QueryRoot>
			<Loader id={id} role={role} userId={userId} />
		</QueryRoot>
	);
}

type One = { check: CheckView };

/** The editable readings of a saved check (the real strength is the server's to compute). */
function fluidOf(check: CheckView): FluidValue {
	if (!check.fluid) return emptyFluid();
	const { realPercentVol: _computed, ...readings } = check.fluid;
	return readings;
}

function Loader(props: { id: string; role: string; userId: string }) {
	const check = useQuery({ queryKey: ['check', props.id], queryFn: () => api<One>(`/api/checks/${props.id}`) });
	const terms = useQuery({ queryKey: ['terms'], queryFn: () => api<{ terms: Record<Part, string[]> }>('/api/vocabulary/terms') });
	const failed = check.error ?? terms.error;
	if (failed) return <p className="notice-error" role="alert">{failed.message}</p>;
	if (!check.data || !terms.data) return <p role="status">Loading the check…</p>;
	// Remount the form whenever the server's version changes, so it starts from what was saved.
	return <Editor key={check.data.check.version} check={check.data.check} terms={terms.data.terms} {...props} />;
}

interface FormValues {
	checkedOn: string;
	reason: CheckView['reason'];
	parts: PartsValue;
	fluid: FluidValue;
	notes: string;
	priority: Priority | '';
	override: { grade: Grade | ''; reason: string };
}

/** The form's values as the shared schema (and the API) expect them. */
function toBody(v: FormValues): CheckBodyInput {
	return {
		checkedOn: v.checkedOn,
		reason: v.reason,
		parts: v.parts,
		overallOverride: v.override.grade ? { grade: v.override.grade, reason: v.override.reason } : null,
		priority: v.priority || null,
		notes: v.notes,
		fluid: v.fluid,
	};
}

/** Where a schema or server path (“check.fluid.pH”, “overallOverride.reason”) shows in the form. */
function formPath(path: string): Path<FormValues> {
	return path.replace(/^check\./, '').replace(/^overallOverride/, 'override') as Path<FormValues>;
}

function Editor({ check, terms, role, userId }: { check: CheckView; terms: Record<Part, string[]>; role: string; userId: string }) {
	const qc = useQueryClient();
	const editable = role === 'conservator' && (check.state === 'draft' || check.state === 'returned');
	const { control, register, handleSubmit, watch, setError, formState } = useForm<FormValues>({
		defaultValues: {
			checkedOn: check.checkedOn,
			reason: check.reason,
			parts: check.parts,
			fluid: fluidOf(check),
			notes: check.notes,
			priority: check.priority ?? '',
			override: { grade: check.overallOverrideReason ? (check.overallGrade ?? '') : '', reason: check.overallOverrideReason ?? '' },
		},
	});
	const errors = formState.errors;
	const [message, setMessage] = useState<string | null>(null);
	// The version this form's save is based on; moved forward only when the person chooses to save
	// over someone else's newer save (the 409 answer carries it).
	const [baseVersion, setBaseVersion] = useState(check.version);
	const [conflict, setConflict] = useState<CheckView | null>(null);
	const parts = watch('parts');
	const override = watch('override');
	const worst = worstGrade(PARTS.map((p) => parts[p].grade));
	const toxic = check.specimen.hazards.some((h) => h.flag !== 'flammable-spirit');
	const suggestion = suggestedPriority(override.grade || worst, toxic);

	const refresh = (c: CheckView) => qc.setQueryData(['check', c.id], { check: c });
	const onError = (e: ApiError) => {
		const current = (e.body as { current?: CheckView } | null)?.current;
		if (e.status === 409 && current) setConflict(current);
		for (const f of e.fields) setError(formPath(f.path), { message: f.message });
		setMessage(e.message);
	};
	const save = useMutation<One, ApiError, FormValues>({ mutationFn: (v) => api<One>(`/api/checks/${check.id}`, { method: 'PUT', body: { version: baseVersion, check: toBody(v) } }), onSuccess: (r) => refresh(r.check), onError });
	const submit = useMutation<One, ApiError, FormValues>({
		mutationFn: async (v) => {
			const saved = await api<One>(`/api/checks/${check.id}`, { method: 'PUT', body: { version: baseVersion, check: toBody(v) } });
			return api<One>(`/api/checks/${check.id}/submit`, { method: 'POST', body: { version: saved.check.version } });
		},
		onSuccess: (r) => refresh(r.check),
		onError,
	});
	const decide = useMutation<One, ApiError, { decision: 'approve' | 'return'; comment: string }>({
		mutationFn: (d) => api<One>(`/api/checks/${check.id}/review`, { method: 'POST', body: d }),
		onSuccess: (r) => refresh(r.check),
		onError,
	});
	const busy = save.isPending || submit.isPending || decide.isPending;
	/** Checks with the shared schema first, so most mistakes show beside their field at once. */
	const run = (m: typeof save) =>
		handleSubmit((v) => {
			setMessage(null);
			const parsed = CheckBodySchema.safeParse(toBody(v));
			if (!parsed.success) {
				for (const i of parsed.error.issues) setError(formPath(i.path.join('.')), { message: i.message });
				setMessage('Some entries need attention; see the fields marked below.');
				return;
			}
			m.mutate(v);
		});
	const err = (path: string) => path.split('.').reduce<unknown>((o, k) => (o as Record<string, unknown> | undefined)?.[k], errors) as { message?: string } | undefined;

	return (
		<div className="space-y-6">
			<header className="flex flex-wrap items-start justify-between gap-4" data-testid="check-header">
				<div>
					<a className="font-mono text-sm font-semibold text-glass-700 underline" href={`/specimens/${check.specimen.id}`}>{check.specimen.objectNumber}</a>
					<h1 className="text-3xl font-semibold">Condition check: {check.specimen.title}</h1>
					<p className="mt-1 text-ink-700">
						{CHECK_LABELS.state[check.state]} · examined by {check.examiner.name}
						{check.correctsCheckId && ' · corrects an earlier approved check'}
					</p>
					<p className="mt-1">
						<a className="text-glass-700 underline" href={`/api/checks/${check.id}/report.pdf`} download data-testid="report-link">
							Download the report (PDF)
						</a>
					</p>
				</div>
				<div className="text-right" data-testid="overall">
					<p className="text-sm text-ink-700">Overall condition</p>
					<GradeBadge grade={(override.grade || worst) as Grade | null} />
				</div>
			</header>
			{check.state === 'returned' && check.reviewComment && (
				<div className="notice-caution" role="status">
					<p className="font-semibold">Returned by {check.reviewer?.name}:</p>
					<p>{check.reviewComment}</p>
				</div>
			)}
			{check.state === 'approved' && <p className="notice-info">Approved by {check.reviewer?.name} on {check.reviewedAt?.slice(0, 10)}. This check is part of the permanent record and cannot be changed; a correction is a new check.</p>}
			{check.specimen.hazards.length > 0 && (
				<p className="notice-caution">Hazards recorded: {check.specimen.hazards.map((h) => LABELS.hazard[h.flag as keyof typeof LABELS.hazard] ?? h.flag).join('; ')}. Open and handle the jar only under your organisation’s risk assessment and local regulations.</p>
			)}
			<section className="card grid gap-4 sm:grid-cols-2">
				<div>
					<label className="field-label" htmlFor="ck-date">Date of the check</label>
					<input id="ck-date" type="date" className="field-input" readOnly={!editable} aria-invalid={err('checkedOn') ? true : undefined} {...register('checkedOn')} />
					<FieldError error={err('checkedOn')} />
				</div>
				<div>
					<label className="field-label" htmlFor="ck-reason">Reason</label>
					<select id="ck-reason" className="field-input" disabled={!editable} {...register('reason')}>
						{REASONS.map((r) => <option key={r} value={r}>{CHECK_LABELS.reason[r]}</option>)}
					</select>
				</div>
			</section>
			<section className="card" aria-labelledby="parts-h">
				<h2 id="parts-h" className="text-xl font-semibold">Part by part</h2>
				<p className="mt-1 text-sm text-ink-700">Good: sound. Fair: minor, mainly aesthetic. Poor: unstable or large losses. Unacceptable: actively deteriorating or a danger to other objects. Qualify each grade with what you see.</p>
				<Controller control={control} name="parts" render={({ field }) => <PartsGrid value={field.value} onChange={field.onChange} terms={terms} readOnly={!editable} errors={err('parts') as never} />} />
			</section>
			<section className="card" aria-labelledby="fluid-h">
				<h2 id="fluid-h" className="mb-3 text-xl font-semibold">Fluid</h2>
				<Controller control={control} name="fluid" render={({ field }) => <FluidFields value={field.value} onChange={field.onChange} readOnly={!editable} errors={err('fluid') as never} />} />
			</section>
			<section className="card grid gap-4 sm:grid-cols-2" aria-labelledby="outcome-h">
				<h2 id="outcome-h" className="text-xl font-semibold sm:col-span-2">Outcome</h2>
				<div>
					<label className="field-label" htmlFor="ck-override">Overall condition</label>
					<select id="ck-override" className="field-input" disabled={!editable} {...register('override.grade')}>
						<option value="">The worst part’s grade{worst ? ` (${CHECK_LABELS.grade[worst]})` : ''}</option>
						{(['good', 'fair', 'poor', 'unacceptable'] as const).filter((g) => g !== worst).map((g) => <option key={g} value={g}>{CHECK_LABELS.grade[g]} (say why)</option>)}
					</select>
					{override.grade && (
						<textarea aria-label="Why the overall grade differs from the worst part" className="field-input mt-2 min-h-[4rem] py-2" readOnly={!editable} placeholder="Why the overall grade differs from the worst part" {...register('override.reason')} />
					)}
					<FieldError error={err('override.reason') ?? err('override')} />
				</div>
				<div>
					<label className="field-label" htmlFor="ck-priority">Treatment priority</label>
					<select id="ck-priority" className="field-input" disabled={!editable} {...register('priority')}>
						<option value="">Choose…</option>
						{PRIORITIES.map((p) => <option key={p} value={p}>{CHECK_LABELS.priority[p]}{p === suggestion ? ' (suggested)' : ''}</option>)}
					</select>
					<p className="mt-1 text-xs text-ink-600">Meniscus’s four steps: urgent, high, routine, none. Suggested from the overall grade and the hazards.</p>
				</div>
				<div className="sm:col-span-2">
					<label className="field-label" htmlFor="ck-notes">Notes</label>
					<textarea id="ck-notes" className="field-input min-h-[5rem] py-2" readOnly={!editable} {...register('notes')} />
					<FieldError error={err('notes')} />
				</div>
				{check.nextCheckDue && <p className="text-sm sm:col-span-2">Next check due {check.nextCheckDue} (from the overall grade when last saved).</p>}
			</section>
			{message && <p className="notice-error" role="alert">{message}</p>}
			{conflict && editable && (
				<div className="notice-caution space-y-2" data-testid="check-conflict">
					<p>
						Saved meanwhile by someone else: overall {conflict.overallGrade ? CHECK_LABELS.grade[conflict.overallGrade] : 'not graded'}
						{PARTS.filter((p) => conflict.parts[p].grade !== parts[p].grade).map((p) => `; ${CHECK_LABELS.part[p]} ${conflict.parts[p].grade ?? 'not graded'}`).join('')}.
						Your entries are still in the form.
					</p>
					<div className="flex flex-wrap gap-2">
						<button type="button" className="btn-primary" onClick={() => { setBaseVersion(conflict.version); setConflict(null); setMessage(null); }}>Keep mine, then save again</button>
						<button type="button" className="btn-secondary" onClick={() => window.location.reload()}>Discard mine, load theirs</button>
					</div>
				</div>
			)}
			{editable && (
				<div className="flex flex-wrap gap-3">
					<button type="button" className="btn-secondary" disabled={busy} onClick={run(save)}>Save draft</button>
					<button type="button" className="btn-primary" disabled={busy} onClick={run(submit)}>Submit for review</button>
				</div>
			)}
			{role === 'reviewer' && check.state === 'in-review' && (
				<p className="text-sm">
					<a className="text-glass-700 underline" href={`/specimens/${check.specimen.id}/compare`} data-testid="compare-link">
						Compare this check's photographs with the last check's
					</a>{' '}
					to see what changed; you can decide there too.
				</p>
			)}
			{role === 'reviewer' && check.state === 'in-review' && check.examiner.id !== userId && (
				<ReviewPanel check={check} pending={busy} onDecide={(decision, comment) => { setMessage(null); decide.mutate({ decision, comment }); }} />
			)}
			<CheckTrail id={check.id} version={check.version} />
		</div>
	);
}

function FieldError({ error }: { error?: { message?: string } }) {
	return error?.message ? <p className="field-error" role="alert">{error.message}</p> : null;
}
