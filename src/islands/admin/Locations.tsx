import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { api, ApiError } from '../../lib/client/api.ts';
import type { LocationView } from '../../lib/locations/schema.ts';

/**
 * Storage locations on the Lists page: the list with each store's flammable limit and temperature
 * range, an inline form to change them (checked again by the server, and audited), and a form to add
 * a location.
 */
export const problemText = (e: ApiError | null) => (e ? [e.message, ...e.fields.map((f) => f.message)].join(' ') : null);

export function Locations() {
	const qc = useQueryClient();
	const q = useQuery({ queryKey: ['locations'], queryFn: () => api<{ locations: LocationView[] }>('/api/locations') });
	const [form, setForm] = useState({ code: '', name: '' });
	const [editing, setEditing] = useState<string | null>(null);
	const add = useMutation<unknown, ApiError>({
		mutationFn: () => api('/api/locations', { method: 'POST', body: form }),
		onSuccess: () => {
			setForm({ code: '', name: '' });
			return qc.invalidateQueries({ queryKey: ['locations'] });
		},
	});
	return (
		<section className="card lg:col-span-2" aria-labelledby="loc-h">
			<h2 id="loc-h" className="text-xl font-semibold">Storage locations</h2>
			<p className="mt-1 text-sm text-ink-700">
				For each store, the flammable volume it may hold and its expected temperature range. The limit is your organisation’s own figure under its local fire code and building
				allowances; Meniscus only adds up the spirit on record against it. The warmest temperature decides which jars have too little airspace.
			</p>
			<ul className="mt-3 divide-y divide-ink-100 text-sm" data-testid="locations">
				{q.data?.locations.map((l) => (
					<li key={l.id} className="py-2" data-testid={`location-${l.code}`}>
						<div className="flex flex-wrap items-center gap-x-4 gap-y-1">
							<span><span className="font-mono font-semibold">{l.code}</span> — {l.name}</span>
							<span className="text-ink-700" data-testid="limits">{summary(l)}</span>
							{editing !== l.id && (
								<button type="button" className="btn-secondary ml-auto" onClick={() => setEditing(l.id)} aria-label={`Edit limits of ${l.code}`}>Edit limits</button>
							)}
						</div>
						{editing === l.id && <LimitsForm location={l} onDone={() => setEditing(null)} />}
					</li>
				))}
			</ul>
			<form className="mt-4 grid gap-3 sm:grid-cols-[8rem_1fr_auto]" onSubmit={(e) => { e.preventDefault(); add.mutate(); }} noValidate>
				<div><label className="field-label" htmlFor="loc-code">Code</label><input id="loc-code" className="field-input" value={form.code} onChange={(e) => setForm({ ...form, code: e.target.value })} /></div>
				<div><label className="field-label" htmlFor="loc-name">Name</label><input id="loc-name" className="field-input" value={form.name} onChange={(e) => setForm({ ...form, name: e.target.value })} /></div>
				<button className="btn-primary self-end" type="submit" disabled={add.isPending}>Add</button>
			</form>
			{add.error && <p className="notice-error mt-3" role="alert">{problemText(add.error)}</p>}
		</section>
	);
}

function summary(l: LocationView): string {
	const limit = l.flammableLimitL === null ? 'no flammable limit' : `flammable limit ${l.flammableLimitL.toLocaleString('en-GB')} L (near from ${l.nearLimitPercent} %)`;
	const range = l.tempMinC === null && l.tempMaxC === null ? 'temperature not set' : `${l.tempMinC ?? '?'} to ${l.tempMaxC ?? '?'} °C`;
	return `${limit}; ${range}`;
}

type Fields = { flammableLimitL: string; nearLimitPercent: string; tempMinC: string; tempMaxC: string };
const text = (n: number | null) => (n === null ? '' : String(n));
/** An empty box is "not set"; anything else is sent as typed (a comma as the decimal mark), for the server to judge. */
const value = (s: string): number | null | string => {
	const t = s.trim().replace(',', '.');
	if (t === '') return null;
	const n = Number(t);
	return Number.isFinite(n) ? n : s;
};

function LimitsForm({ location: l, onDone }: { location: LocationView; onDone: () => void }) {
	const qc = useQueryClient();
	const [f, setF] = useState<Fields>({ flammableLimitL: text(l.flammableLimitL), nearLimitPercent: String(l.nearLimitPercent), tempMinC: text(l.tempMinC), tempMaxC: text(l.tempMaxC) });
	const save = useMutation<unknown, ApiError>({
		mutationFn: () => api(`/api/locations/${l.id}`, { method: 'PATCH', body: Object.fromEntries(Object.entries(f).map(([k, v]) => [k, value(v)])) }),
		onSuccess: async () => {
			await qc.invalidateQueries({ queryKey: ['locations'] });
			onDone();
		},
	});
	const field = (key: keyof Fields, label: string, hint: string) => (
		<div>
			<label className="field-label" htmlFor={`lim-${l.id}-${key}`}>{label}</label>
			<input id={`lim-${l.id}-${key}`} inputMode="decimal" className="field-input" value={f[key]} onChange={(e) => setF({ ...f, [key]: e.target.value })} />
			<p className="mt-1 text-xs text-ink-600">{hint}</p>
		</div>
	);
	return (
		<form className="mt-3 rounded-md border border-ink-100 bg-paper p-3" onSubmit={(e) => { e.preventDefault(); save.mutate(); }} noValidate aria-label={`Limits of ${l.code}`}>
			<div className="grid gap-3 sm:grid-cols-4">
				{field('flammableLimitL', 'Flammable limit (L)', 'Empty: no limit set.')}
				{field('nearLimitPercent', 'Near the limit at (%)', 'Warn from this share; 80 % unless you choose.')}
				{field('tempMinC', 'Coolest (°C)', 'Expected, −20 to +40.')}
				{field('tempMaxC', 'Warmest (°C)', 'Expected, −20 to +40.')}
			</div>
			{save.error && <p className="notice-error mt-3" role="alert">{problemText(save.error)}</p>}
			<div className="mt-3 flex gap-3">
				<button className="btn-primary" type="submit" disabled={save.isPending}>Save limits</button>
				<button className="btn-secondary" type="button" onClick={onDone}>Cancel</button>
			</div>
		</form>
	);
}
