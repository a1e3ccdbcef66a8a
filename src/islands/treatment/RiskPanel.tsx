import { useState } from 'react';
import { CONTROLS, CONTROL_LABELS, type Control } from '../../lib/treatment/controls.ts';
import { HAZARD_KINDS, HAZARD_LABELS, USUAL_CONTROLS, type HazardKind, type SuggestedHazard } from '../../lib/treatment/hazards.ts';
import { LEVELS, LIKELIHOOD_LABELS, SEVERITY_LABELS, type Level, type Rating } from '../../lib/treatment/risk.ts';
import { shortId } from '../../lib/treatment/plan.ts';
import type { EditBody } from '../../lib/treatment/edit.ts';
import { BandBadge, RiskMatrix } from './RiskMatrix.tsx';
import { HazardCautions } from './HazardCautions.tsx';

type Risk = EditBody['risk'];
type Hazard = Risk['hazards'][number];

/**
 * The risk assessment: the hazards the record suggests (each assessed or dismissed with a reason),
 * each assessed hazard rated before and after its controls on the 5 × 5 matrix, and the cautions
 * for what is assessed.
 */
export function RiskPanel(props: { risk: Risk; suggested: SuggestedHazard[]; editable: boolean; onChange: (r: Risk) => void }) {
	const { risk, editable, onChange } = props;
	const covered = new Set<HazardKind>([...risk.hazards.map((h) => h.kind), ...risk.dismissed.map((d) => d.kind)]);
	const open = props.suggested.filter((s) => !covered.has(s.kind));
	const add = (kind: HazardKind, description = '') =>
		onChange({
			...risk,
			hazards: [...risk.hazards, { id: shortId(), kind, description, inherent: { likelihood: 3, severity: 3 }, controls: [...USUAL_CONTROLS[kind]], otherControls: '', residual: { likelihood: 2, severity: 3 } }],
		});
	const setHazard = (i: number, h: Hazard) => onChange({ ...risk, hazards: risk.hazards.map((x, j) => (j === i ? h : x)) });
	return (
		<div className="space-y-4">
			{open.length > 0 && (
				<div className="space-y-2" data-testid="suggested-hazards">
					<h3 className="font-semibold">Suggested from the record</h3>
					{open.map((s) => (
						<Suggestion key={s.kind} s={s} editable={editable} onAssess={() => add(s.kind, s.reason)} onDismiss={(reason) => onChange({ ...risk, dismissed: [...risk.dismissed, { kind: s.kind, reason }] })} />
					))}
				</div>
			)}
			{risk.hazards.map((h, i) => (
				<HazardCard key={h.id} h={h} n={i + 1} editable={editable} onChange={(x) => setHazard(i, x)} onRemove={() => onChange({ ...risk, hazards: risk.hazards.filter((_, j) => j !== i) })} />
			))}
			{risk.dismissed.length > 0 && (
				<div>
					<h3 className="font-semibold">Judged not to apply</h3>
					<ul className="mt-1 space-y-1 text-sm">
						{risk.dismissed.map((d, i) => (
							<li key={d.kind} className="flex flex-wrap items-center gap-2">
								<span className="font-semibold">{HAZARD_LABELS[d.kind]}:</span> <span>{d.reason}</span>
								{editable && (
									<button type="button" className="text-sm text-glass-700 underline" onClick={() => onChange({ ...risk, dismissed: risk.dismissed.filter((_, j) => j !== i) })}>
										Reconsider
									</button>
								)}
							</li>
						))}
					</ul>
				</div>
			)}
			{editable && <AddHazard onAdd={(k) => add(k)} />}
			<label className="block">
				<span className="field-label">Notes on the assessment</span>
				<textarea className="field-input min-h-[4rem] py-2" value={risk.notes} disabled={!editable} onChange={(e) => onChange({ ...risk, notes: e.target.value })} />
			</label>
			<HazardCautions kinds={[...risk.hazards.map((h) => h.kind), ...open.map((s) => s.kind)]} />
		</div>
	);
}

function Suggestion({ s, editable, onAssess, onDismiss }: { s: SuggestedHazard; editable: boolean; onAssess: () => void; onDismiss: (reason: string) => void }) {
	const [why, setWhy] = useState<string | null>(null);
	return (
		<div className="rounded-md border border-spirit-300 bg-spirit-50 p-3 text-sm" data-testid={`suggested-${s.kind}`}>
			<p>
				<span className="font-semibold">{HAZARD_LABELS[s.kind]}.</span> {s.reason}
			</p>
			{editable && why === null && (
				<div className="mt-2 flex flex-wrap gap-2">
					<button type="button" className="btn-primary" onClick={onAssess}>Assess this hazard</button>
					<button type="button" className="btn-secondary" onClick={() => setWhy('')}>Does not apply…</button>
				</div>
			)}
			{editable && why !== null && (
				<div className="mt-2 flex flex-wrap items-end gap-2">
					<label className="min-w-[16rem] flex-1">
						<span className="field-label">Why it does not apply</span>
						<input className="field-input" value={why} onChange={(e) => setWhy(e.target.value)} />
					</label>
					<button type="button" className="btn-primary" disabled={why.trim().length < 5} onClick={() => onDismiss(why.trim())}>Record</button>
					<button type="button" className="btn-secondary" onClick={() => setWhy(null)}>Cancel</button>
				</div>
			)}
		</div>
	);
}

function AddHazard({ onAdd }: { onAdd: (k: HazardKind) => void }) {
	const [kind, setKind] = useState<HazardKind>('other');
	return (
		<div className="flex flex-wrap items-end gap-2">
			<label>
				<span className="field-label">Add a hazard</span>
				<select className="field-input" value={kind} onChange={(e) => setKind(e.target.value as HazardKind)}>
					{HAZARD_KINDS.map((k) => (
						<option key={k} value={k}>{HAZARD_LABELS[k]}</option>
					))}
				</select>
			</label>
			<button type="button" className="btn-secondary" onClick={() => onAdd(kind)}>Add</button>
		</div>
	);
}

function LevelSelect({ label, value, labels, disabled, onChange }: { label: string; value: Level; labels: Record<Level, string>; disabled: boolean; onChange: (l: Level) => void }) {
	return (
		<label className="block">
			<span className="field-label">{label}</span>
			<select className="field-input" value={value} disabled={disabled} onChange={(e) => onChange(Number(e.target.value) as Level)}>
				{LEVELS.map((l) => (
					<option key={l} value={l}>{l} · {labels[l]}</option>
				))}
			</select>
		</label>
	);
}

function RatingFields({ title, r, disabled, onChange, prefix }: { title: string; r: Rating; disabled: boolean; onChange: (r: Rating) => void; prefix: string }) {
	return (
		<fieldset className="space-y-2">
			<legend className="text-sm font-semibold">{title} <BandBadge rating={r} /></legend>
			<LevelSelect label={`${prefix} likelihood`} value={r.likelihood} labels={LIKELIHOOD_LABELS} disabled={disabled} onChange={(likelihood) => onChange({ ...r, likelihood })} />
			<LevelSelect label={`${prefix} severity`} value={r.severity} labels={SEVERITY_LABELS} disabled={disabled} onChange={(severity) => onChange({ ...r, severity })} />
		</fieldset>
	);
}

function HazardCard({ h, n, editable, onChange, onRemove }: { h: Hazard; n: number; editable: boolean; onChange: (h: Hazard) => void; onRemove: () => void }) {
	const toggle = (c: Control, on: boolean) => onChange({ ...h, controls: on ? [...h.controls, c] : h.controls.filter((x) => x !== c) });
	return (
		<section className="rounded-md border border-ink-200 p-4" aria-label={`Hazard ${n}: ${HAZARD_LABELS[h.kind]}`} data-testid="hazard">
			<div className="flex flex-wrap items-baseline justify-between gap-2">
				<h3 className="font-semibold">{n}. {HAZARD_LABELS[h.kind]}</h3>
				{editable && (
					<button type="button" className="text-sm text-alert-700 underline" onClick={onRemove}>Remove</button>
				)}
			</div>
			<label className="mt-2 block">
				<span className="field-label">What and where</span>
				<textarea className="field-input min-h-[3rem] py-2" value={h.description} disabled={!editable} onChange={(e) => onChange({ ...h, description: e.target.value })} />
			</label>
			<div className="mt-3 grid gap-4 md:grid-cols-[1fr_1fr_auto]">
				<RatingFields title="Before controls" prefix="Before:" r={h.inherent} disabled={!editable} onChange={(inherent) => onChange({ ...h, inherent })} />
				<RatingFields title="Residual, with the controls" prefix="Residual:" r={h.residual} disabled={!editable} onChange={(residual) => onChange({ ...h, residual })} />
				<RiskMatrix inherent={h.inherent} residual={h.residual} label={`Risk matrix for hazard ${n}`} />
			</div>
			<fieldset className="mt-3">
				<legend className="text-sm font-semibold">Controls</legend>
				<div className="mt-1 grid gap-1 sm:grid-cols-2">
					{CONTROLS.map((c) => (
						<label key={c} className="flex min-h-touch items-center gap-2 text-sm">
							<input type="checkbox" className="h-5 w-5" checked={h.controls.includes(c)} disabled={!editable} onChange={(e) => toggle(c, e.currentTarget.checked)} />
							{CONTROL_LABELS[c]}
						</label>
					))}
				</div>
			</fieldset>
			<label className="mt-2 block">
				<span className="field-label">Other controls</span>
				<input className="field-input" value={h.otherControls} disabled={!editable} onChange={(e) => onChange({ ...h, otherControls: e.target.value })} />
			</label>
		</section>
	);
}
