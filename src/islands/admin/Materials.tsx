import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { api, ApiError } from '../../lib/client/api.ts';
import { MATERIAL_KINDS, MATERIAL_KIND_LABELS, type MaterialKind } from '../../lib/treatment/vocabulary.ts';
import type { MaterialView } from '../../lib/treatment/view.ts';
import { problemText } from './Locations.tsx';

/**
 * The materials treatments record, with each sealant's cure period (the cure timers read it).
 * Materials are never deleted, since treatments name them; one no longer used is taken off the
 * pick lists.
 */
export function Materials() {
	const qc = useQueryClient();
	const q = useQuery({ queryKey: ['materials', 'all'], queryFn: () => api<{ materials: MaterialView[] }>('/api/treatment-materials?all=1') });
	const [kind, setKind] = useState<MaterialKind>('sealant');
	const [name, setName] = useState('');
	const [cure, setCure] = useState('24');
	const refresh = () => qc.invalidateQueries({ queryKey: ['materials'] });
	const add = useMutation<unknown, ApiError>({
		mutationFn: () => api('/api/treatment-materials', { method: 'POST', body: { kind, name, cureHours: kind === 'sealant' && cure.trim() !== '' ? Number(cure) : null } }),
		onSuccess: () => {
			setName('');
			return refresh();
		},
	});
	const patch = useMutation<unknown, ApiError, { id: string; body: Record<string, unknown> }>({
		mutationFn: ({ id, body }) => api(`/api/treatment-materials/${id}`, { method: 'PATCH', body }),
		onSuccess: refresh,
	});
	return (
		<section className="card" aria-labelledby="mat-h" data-testid="materials">
			<h2 id="mat-h" className="text-xl font-semibold">Treatment materials</h2>
			<p className="mt-1 text-sm text-ink-700">
				Sealants, threads and other materials offered in a treatment’s steps. A sealant’s cure period sets when a treated jar may be disturbed; “at least overnight” for silicone is common practice with no published source, so use your own figures or the maker’s.
			</p>
			<table className="mt-4 w-full text-left text-sm">
				<thead className="text-ink-600">
					<tr>
						<th className="py-2 pr-3 font-semibold">Kind</th>
						<th className="py-2 pr-3 font-semibold">Name</th>
						<th className="py-2 pr-3 font-semibold">Cure period (h)</th>
						<th className="py-2 font-semibold">On the lists</th>
					</tr>
				</thead>
				<tbody>
					{q.data?.materials.map((m) => (
						<tr key={m.id} className="border-t border-ink-100">
							<td className="py-2 pr-3">{MATERIAL_KIND_LABELS[m.kind]}</td>
							<td className="py-2 pr-3">
								{m.name}
								{m.note && <span className="block text-xs text-ink-600">{m.note}</span>}
							</td>
							<td className="py-2 pr-3">
								{m.kind === 'sealant' ? <CureField m={m} onSave={(h) => patch.mutate({ id: m.id, body: { cureHours: h } })} /> : '—'}
							</td>
							<td className="py-2">
								<input type="checkbox" className="h-5 w-5" aria-label={`${m.name} on the lists`} checked={m.active} onChange={(e) => patch.mutate({ id: m.id, body: { active: e.currentTarget.checked } })} />
							</td>
						</tr>
					))}
				</tbody>
			</table>
			<form className="mt-4 grid gap-3 sm:grid-cols-[10rem_1fr_8rem_auto]" onSubmit={(e) => { e.preventDefault(); add.mutate(); }} noValidate>
				<div>
					<label className="field-label" htmlFor="mat-kind">Kind</label>
					<select id="mat-kind" className="field-input" value={kind} onChange={(e) => setKind(e.target.value as MaterialKind)}>
						{MATERIAL_KINDS.map((k) => <option key={k} value={k}>{MATERIAL_KIND_LABELS[k]}</option>)}
					</select>
				</div>
				<div><label className="field-label" htmlFor="mat-name">Material name</label><input id="mat-name" className="field-input" value={name} onChange={(e) => setName(e.target.value)} /></div>
				<div><label className="field-label" htmlFor="mat-cure">Cure (h)</label><input id="mat-cure" inputMode="decimal" className="field-input" disabled={kind !== 'sealant'} value={kind === 'sealant' ? cure : ''} onChange={(e) => setCure(e.target.value)} /></div>
				<button className="btn-primary self-end" type="submit" disabled={add.isPending}>Add material</button>
			</form>
			{(add.error ?? patch.error) && <p className="notice-error mt-3" role="alert">{problemText((add.error ?? patch.error)!)}</p>}
		</section>
	);
}

function CureField({ m, onSave }: { m: MaterialView; onSave: (h: number | null) => void }) {
	const [v, setV] = useState(m.cureHours === null ? '' : String(m.cureHours));
	const changed = v !== (m.cureHours === null ? '' : String(m.cureHours));
	return (
		<span className="flex items-center gap-2">
			<input className="field-input mt-0 w-24" inputMode="decimal" aria-label={`Cure period of ${m.name}`} value={v} onChange={(e) => setV(e.target.value)} />
			{changed && <button type="button" className="btn-secondary" onClick={() => onSave(v.trim() === '' ? null : Number(v))}>Save</button>}
		</span>
	);
}
