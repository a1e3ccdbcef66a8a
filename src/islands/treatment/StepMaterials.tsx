import { MATERIAL_KINDS, MATERIAL_KIND_LABELS, type MaterialKind } from '../../lib/treatment/vocabulary.ts';
import { PRESERVATIVE_KINDS, LABELS } from '../../lib/specimen/vocabulary.ts';
import type { EditMaterial } from '../../lib/treatment/edit.ts';
import type { MaterialView, StepView } from '../../lib/treatment/view.ts';
import { fromLocalInput, toLocalInput } from './time.ts';

/**
 * The materials one step used: a sealant from the organisation's list (its cure period starts the
 * timer when it goes on), threads and other materials, and fluid batches with their strength (a
 * meter reading is corrected to 20 °C by the server, as on the Fluid tools page).
 */
export function StepMaterials(props: { materials: EditMaterial[]; saved: StepView['materials']; list: MaterialView[]; editable: boolean; n: number; onChange: (m: EditMaterial[]) => void }) {
	const { materials, editable, onChange } = props;
	const set = (i: number, m: Partial<EditMaterial>) => onChange(materials.map((x, j) => (j === i ? { ...x, ...m } : x)));
	const add = (kind: MaterialKind) =>
		onChange([
			...materials,
			{ kind, materialId: null, name: '', amount: '', appliedAt: null, fluid: kind === 'fluid' ? { batch: '', preservativeKind: 'ethanol', statedPercentVol: null, readingPercentVol: null, tempC: null, glass: 'soda-lime' } : null },
		]);
	return (
		<div className="space-y-2">
			{materials.map((m, i) => {
				const saved = props.saved[i];
				const choices = props.list.filter((x) => x.kind === m.kind);
				const id = `s${props.n}m${i}`;
				return (
					<div key={i} className="grid gap-2 rounded border border-ink-100 bg-ink-50 p-2 sm:grid-cols-4" data-testid="material">
						<p className="text-sm font-semibold sm:col-span-4">{MATERIAL_KIND_LABELS[m.kind]}</p>
						{m.kind !== 'fluid' && (
							<label className="sm:col-span-2">
								<span className="field-label">From the list</span>
								<select
									className="field-input"
									aria-label={`Step ${props.n} ${MATERIAL_KIND_LABELS[m.kind].toLowerCase()} from the list`}
									value={m.materialId ?? ''}
									disabled={!editable}
									onChange={(e) => {
										const pick = choices.find((x) => x.id === e.target.value);
										set(i, { materialId: pick?.id ?? null, name: pick?.name ?? m.name });
									}}
								>
									<option value="">— not on the list —</option>
									{choices.map((x) => (
										<option key={x.id} value={x.id}>{x.name}{x.cureHours !== null ? ` (cures ${x.cureHours} h)` : ''}</option>
									))}
								</select>
							</label>
						)}
						<label className={m.kind === 'fluid' ? 'sm:col-span-2' : ''}>
							<span className="field-label">Name</span>
							<input id={`${id}-name`} className="field-input" value={m.name} disabled={!editable} onChange={(e) => set(i, { name: e.target.value })} />
						</label>
						<label>
							<span className="field-label">Amount</span>
							<input className="field-input" value={m.amount} disabled={!editable} onChange={(e) => set(i, { amount: e.target.value })} />
						</label>
						{m.kind === 'sealant' && (
							<label className="sm:col-span-2">
								<span className="field-label">Went on at</span>
								<input type="datetime-local" className="field-input" aria-label={`Step ${props.n} sealant went on at`} value={toLocalInput(m.appliedAt)} disabled={!editable} onChange={(e) => set(i, { appliedAt: fromLocalInput(e.target.value) })} />
							</label>
						)}
						{m.kind === 'sealant' && saved?.cureHours != null && <p className="self-end text-sm text-ink-700 sm:col-span-2">Cure period on record: {saved.cureHours} h</p>}
						{m.fluid && <FluidBatch f={m.fluid} real={saved?.fluid?.realPercentVol ?? null} editable={editable} n={props.n} onChange={(fluid) => set(i, { fluid })} />}
						{editable && (
							<button type="button" className="justify-self-start text-sm text-alert-700 underline sm:col-span-4" onClick={() => onChange(materials.filter((_, j) => j !== i))}>
								Remove this material
							</button>
						)}
					</div>
				);
			})}
			{editable && (
				<div className="flex flex-wrap gap-2">
					{MATERIAL_KINDS.map((k) => (
						<button key={k} type="button" className="btn-secondary" onClick={() => add(k)} aria-label={`Step ${props.n}: add ${MATERIAL_KIND_LABELS[k].toLowerCase()}`}>
							+ {MATERIAL_KIND_LABELS[k]}
						</button>
					))}
				</div>
			)}
		</div>
	);
}

type Fluid = NonNullable<EditMaterial['fluid']>;
const num = (v: string) => (v.trim() === '' ? null : Number(v));

function FluidBatch({ f, real, editable, n, onChange }: { f: Fluid; real: number | null; editable: boolean; n: number; onChange: (f: Fluid) => void }) {
	return (
		<>
			<label>
				<span className="field-label">Batch</span>
				<input className="field-input" aria-label={`Step ${n} fluid batch`} value={f.batch} disabled={!editable} onChange={(e) => onChange({ ...f, batch: e.target.value })} />
			</label>
			<label>
				<span className="field-label">Fluid</span>
				<select className="field-input" value={f.preservativeKind} disabled={!editable} onChange={(e) => onChange({ ...f, preservativeKind: e.target.value as Fluid['preservativeKind'] })}>
					{PRESERVATIVE_KINDS.map((k) => (
						<option key={k} value={k}>{LABELS.preservative[k]}</option>
					))}
				</select>
			</label>
			<label>
				<span className="field-label">Made to (% vol)</span>
				<input type="number" step="0.1" className="field-input" aria-label={`Step ${n} fluid made to`} value={f.statedPercentVol ?? ''} disabled={!editable} onChange={(e) => onChange({ ...f, statedPercentVol: num(e.target.value) })} />
			</label>
			<label>
				<span className="field-label">Meter reading (% vol)</span>
				<input type="number" step="0.1" className="field-input" aria-label={`Step ${n} fluid meter reading`} value={f.readingPercentVol ?? ''} disabled={!editable} onChange={(e) => onChange({ ...f, readingPercentVol: num(e.target.value) })} />
			</label>
			<label>
				<span className="field-label">at (°C)</span>
				<input type="number" step="0.1" className="field-input" aria-label={`Step ${n} fluid temperature`} value={f.tempC ?? ''} disabled={!editable} onChange={(e) => onChange({ ...f, tempC: num(e.target.value) })} />
			</label>
			<p className="self-end text-sm text-ink-700" data-testid="fluid-real">
				{real !== null ? `Real strength at 20 °C: ${real.toFixed(1)} % vol` : 'Real strength: saved readings only'}
			</p>
		</>
	);
}
