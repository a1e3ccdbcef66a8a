import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { QueryRoot } from '../QueryRoot.tsx';
import { api, ApiError } from '../../lib/client/api.ts';
import { CHECK_LABELS, DEFAULT_TERMS, GRADES, PARTS, type Grade, type Part } from '../../lib/check/vocabulary.ts';
import { Locations, problemText } from './Locations.tsx';
import { Materials } from './Materials.tsx';

/**
 * The lists an administrator keeps: storage locations with their limits, damage terms per part
 * (added to the built-in ones), the months to the next check per overall grade, and the
 * materials treatments record (with sealants' cure periods).
 */
export default function Lists() {
	return (
		<QueryRoot>
			<div className="grid gap-6 lg:grid-cols-2">
				<Locations />
				<Intervals />
				<div className="lg:col-span-2">
					<Terms />
				</div>
				<div className="lg:col-span-2">
					<Materials />
				</div>
			</div>
		</QueryRoot>
	);
}

function Intervals() {
	const qc = useQueryClient();
	const q = useQuery({ queryKey: ['intervals'], queryFn: () => api<{ intervals: Record<Grade, number> }>('/api/settings/intervals') });
	const [edit, setEdit] = useState<Record<Grade, string> | null>(null);
	const values = edit ?? (q.data ? (Object.fromEntries(GRADES.map((g) => [g, String(q.data.intervals[g])])) as Record<Grade, string>) : null);
	const save = useMutation<unknown, ApiError>({
		mutationFn: () => api('/api/settings/intervals', { method: 'PUT', body: Object.fromEntries(GRADES.map((g) => [g, Number(values![g])])) }),
		onSuccess: () => {
			setEdit(null);
			return qc.invalidateQueries({ queryKey: ['intervals'] });
		},
	});
	return (
		<section className="card" aria-labelledby="int-h">
			<h2 id="int-h" className="text-xl font-semibold">Months to the next check</h2>
			<p className="mt-1 text-sm text-ink-700">By overall condition. About six months is the general guideline for monitoring; these numbers are the collection’s own choice.</p>
			{values && (
				<form className="mt-4 grid grid-cols-2 gap-3 sm:grid-cols-4" onSubmit={(e) => { e.preventDefault(); save.mutate(); }} noValidate>
					{GRADES.map((g) => (
						<div key={g}>
							<label className="field-label" htmlFor={`int-${g}`}>{CHECK_LABELS.grade[g]}</label>
							<input id={`int-${g}`} inputMode="numeric" className="field-input" value={values[g]} onChange={(e) => setEdit({ ...values, [g]: e.target.value })} />
						</div>
					))}
					<button className="btn-primary col-span-2 sm:col-span-4 sm:w-fit" type="submit" disabled={save.isPending || !edit}>Save intervals</button>
				</form>
			)}
			{save.error && <p className="notice-error mt-3" role="alert">{problemText(save.error)}</p>}
		</section>
	);
}

function Terms() {
	const qc = useQueryClient();
	const q = useQuery({ queryKey: ['terms'], queryFn: () => api<{ terms: Record<Part, string[]> }>('/api/vocabulary/terms') });
	const [part, setPart] = useState<Part>('fluid');
	const [term, setTerm] = useState('');
	const add = useMutation<unknown, ApiError>({
		mutationFn: () => api('/api/vocabulary/terms', { method: 'POST', body: { part, term } }),
		onSuccess: () => {
			setTerm('');
			return qc.invalidateQueries({ queryKey: ['terms'] });
		},
	});
	return (
		<section className="card" aria-labelledby="terms-h">
			<h2 id="terms-h" className="text-xl font-semibold">Damage terms</h2>
			<p className="mt-1 text-sm text-ink-700">The terms offered for each part in a condition check. The built-in ones follow the trade’s usage; add what your collection needs.</p>
			<div className="mt-4 grid gap-4 md:grid-cols-2">
				{PARTS.map((p) => (
					<div key={p}>
						<h3 className="font-semibold">{CHECK_LABELS.part[p]}</h3>
						<p className="text-sm text-ink-700">
							{q.data?.terms[p].map((t) => (DEFAULT_TERMS[p].includes(t) ? t : `${t} (added)`)).join(', ')}
						</p>
					</div>
				))}
			</div>
			<form className="mt-4 grid gap-3 sm:grid-cols-[12rem_1fr_auto]" onSubmit={(e) => { e.preventDefault(); add.mutate(); }} noValidate>
				<div>
					<label className="field-label" htmlFor="term-part">Part</label>
					<select id="term-part" className="field-input" value={part} onChange={(e) => setPart(e.target.value as Part)}>
						{PARTS.map((p) => <option key={p} value={p}>{CHECK_LABELS.part[p]}</option>)}
					</select>
				</div>
				<div><label className="field-label" htmlFor="term-new">New term</label><input id="term-new" className="field-input" value={term} onChange={(e) => setTerm(e.target.value)} /></div>
				<button className="btn-primary self-end" type="submit" disabled={add.isPending}>Add term</button>
			</form>
			{add.error && <p className="notice-error mt-3" role="alert">{problemText(add.error)}</p>}
		</section>
	);
}
