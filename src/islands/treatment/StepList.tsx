import { STEP_KIND_INFO, STEP_STATUSES, STEP_STATUS_LABELS, type StepStatus } from '../../lib/treatment/vocabulary.ts';
import { shortId } from '../../lib/treatment/plan.ts';
import type { EditStep } from '../../lib/treatment/edit.ts';
import type { CureWarning } from '../../lib/treatment/cure.ts';
import type { MaterialView, Person, StepView } from '../../lib/treatment/view.ts';
import { StepMaterials } from './StepMaterials.tsx';
import { fromLocalInput, toLocalInput } from './time.ts';

/**
 * The action plan: one card per step with its status, who did it and when, time spent, notes
 * and materials. Work steps cannot leave "planned" until the risk assessment is signed off; the
 * card says so instead of offering the choice. Cure warnings show on the steps they concern.
 */
export function StepList(props: {
	steps: EditStep[];
	saved: StepView[];
	signedOff: boolean;
	editable: boolean;
	people: Person[];
	materials: MaterialView[];
	warnings: CureWarning[];
	onChange: (steps: EditStep[]) => void;
}) {
	const { steps, editable, onChange } = props;
	const set = (i: number, s: Partial<EditStep>) => onChange(steps.map((x, j) => (j === i ? { ...x, ...s } : x)));
	const move = (i: number, d: -1 | 1) => {
		const next = [...steps];
		const [s] = next.splice(i, 1);
		next.splice(i + d, 0, s!);
		onChange(next);
	};
	const was = new Map(props.saved.map((s) => [s.id, s]));
	return (
		<ol className="space-y-3" data-testid="steps">
			{steps.map((s, i) => {
				const info = STEP_KIND_INFO[s.kind];
				const savedStatus = was.get(s.id)?.status ?? 'planned';
				const gated = info.work && !props.signedOff && (savedStatus === 'planned' || savedStatus === 'skipped');
				const allowed = (st: StepStatus) => !gated || st === 'planned' || st === 'skipped';
				const warnings = props.warnings.filter((w) => w.stepId === s.id);
				const n = i + 1;
				return (
					<li key={s.id} className="rounded-md border border-ink-200 bg-white p-3" data-testid="step" data-kind={s.kind} data-status={s.status}>
						<div className="flex flex-wrap items-end gap-3">
							<span className="pb-3 font-mono text-sm text-ink-600">{n}.</span>
							<label className="min-w-[14rem] flex-1">
								<span className="field-label">Step</span>
								<input className="field-input" value={s.title} disabled={!editable} onChange={(e) => set(i, { title: e.target.value })} aria-label={`Step ${n} name`} />
							</label>
							<label>
								<span className="field-label">Status</span>
								<select className="field-input" value={s.status} disabled={!editable} onChange={(e) => set(i, { status: e.target.value as StepStatus })} aria-label={`Step ${n} status`}>
									{STEP_STATUSES.map((st) => (
										<option key={st} value={st} disabled={!allowed(st)}>
											{STEP_STATUS_LABELS[st]}
										</option>
									))}
								</select>
							</label>
							{editable && (
								<div className="flex gap-1 pb-1">
									<button type="button" className="btn-secondary px-2" disabled={i === 0} onClick={() => move(i, -1)} aria-label={`Move step ${n} up`}>↑</button>
									<button type="button" className="btn-secondary px-2" disabled={i === steps.length - 1} onClick={() => move(i, 1)} aria-label={`Move step ${n} down`}>↓</button>
									<button type="button" className="btn-secondary px-2" disabled={s.status !== 'planned'} onClick={() => onChange(steps.filter((_, j) => j !== i))} aria-label={`Remove step ${n}`}>✕</button>
								</div>
							)}
						</div>
						{info.hint && <p className="mt-1 text-sm text-ink-600">{info.hint}</p>}
						{gated && editable && <p className="mt-1 text-sm text-spirit-800">Work on the open jar: it can start once a reviewer has signed off the risk assessment.</p>}
						{warnings.map((w) => (
							<p key={w.message} className={w.kind === 'wait' ? 'notice-caution mt-2' : 'notice-info mt-2'} role={w.kind === 'wait' ? 'alert' : undefined} data-testid="cure-warning">
								{w.message}
							</p>
						))}
						{s.status !== 'planned' && (
							// Open while the step is under way or just changed; a finished step folds away.
							<details className="mt-2" open={s.status === 'started' || savedStatus !== s.status}>
								<summary className="cursor-pointer text-sm font-semibold text-glass-700">Record of this step</summary>
								<div className="mt-2 grid gap-2 sm:grid-cols-4">
									<label>
										<span className="field-label">Who</span>
										<select className="field-input" value={s.doneBy ?? ''} disabled={!editable} onChange={(e) => set(i, { doneBy: e.target.value || null })} aria-label={`Step ${n} done by`}>
											<option value="">— me —</option>
											{props.people.map((p) => (
												<option key={p.id} value={p.id}>{p.name}</option>
											))}
										</select>
									</label>
									<label>
										<span className="field-label">Started</span>
										<input type="datetime-local" className="field-input" value={toLocalInput(s.startedAt)} disabled={!editable} onChange={(e) => set(i, { startedAt: fromLocalInput(e.target.value) })} aria-label={`Step ${n} started at`} />
									</label>
									<label>
										<span className="field-label">Finished</span>
										<input type="datetime-local" className="field-input" value={toLocalInput(s.finishedAt)} disabled={!editable} onChange={(e) => set(i, { finishedAt: fromLocalInput(e.target.value) })} aria-label={`Step ${n} finished at`} />
									</label>
									<label>
										<span className="field-label">Time spent (min)</span>
										<input type="number" min={0} step={1} className="field-input" value={s.minutes ?? ''} disabled={!editable} onChange={(e) => set(i, { minutes: e.target.value === '' ? null : Math.round(Number(e.target.value)) })} aria-label={`Step ${n} minutes`} />
									</label>
									<label className="sm:col-span-4">
										<span className="field-label">Notes</span>
										<textarea className="field-input min-h-[3rem] py-2" value={s.notes} disabled={!editable} onChange={(e) => set(i, { notes: e.target.value })} aria-label={`Step ${n} notes`} />
									</label>
									<div className="sm:col-span-4">
										<StepMaterials materials={s.materials} saved={was.get(s.id)?.materials ?? []} list={props.materials} editable={editable} n={n} onChange={(materials) => set(i, { materials })} />
									</div>
								</div>
							</details>
						)}
						{s.status === 'planned' && editable && (
							<label className="mt-2 block">
								<span className="sr-only">Step {n} plan notes</span>
								<textarea className="field-input min-h-[2.75rem] py-2 text-sm" placeholder="Notes for this step" value={s.notes} onChange={(e) => set(i, { notes: e.target.value })} aria-label={`Step ${n} plan notes`} />
							</label>
						)}
						{s.status === 'planned' && !editable && s.notes && <p className="mt-1 text-sm">{s.notes}</p>}
					</li>
				);
			})}
			{editable && (
				<li>
					<button
						type="button"
						className="btn-secondary"
						onClick={() => onChange([...steps, { id: shortId(), kind: 'custom', title: 'New step', status: 'planned', doneBy: null, startedAt: null, finishedAt: null, minutes: null, notes: '', materials: [] }])}
					>
						+ Add a step
					</button>
				</li>
			)}
		</ol>
	);
}
