import { useEffect, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { api } from '../../lib/client/api.ts';
import { CHECK_FILTERS, type RegisterQuery } from '../../lib/specimen/query.ts';
import { CHECK_LABELS, GRADES, PRIORITIES } from '../../lib/check/vocabulary.ts';
import { CONTAINER_SHAPES, HAZARD_FLAGS, LABELS, PRESERVATIVE_KINDS, SEAL_TYPES } from '../../lib/specimen/vocabulary.ts';

/** Search and filters of the register; the search waits for a pause in typing before it asks. */
export function Filters({ query, update }: { query: RegisterQuery; update: (c: Partial<RegisterQuery>) => void }) {
	const [text, setText] = useState(query.q ?? '');
	useEffect(() => setText(query.q ?? ''), [query.q]);
	useEffect(() => {
		if ((query.q ?? '') === text) return;
		const t = setTimeout(() => update({ q: text || undefined }), 300);
		return () => clearTimeout(t);
	}, [text, query.q, update]);
	const locations = useQuery({ queryKey: ['locations'], queryFn: () => api<{ locations: { id: string; code: string; name: string }[] }>('/api/locations') });
	const select = (key: keyof RegisterQuery, label: string, options: [string, string][]) => (
		<div>
			<label className="field-label" htmlFor={`filter-${key}`}>{label}</label>
			<select
				id={`filter-${key}`}
				className="field-input"
				value={(query[key] as string | undefined) ?? ''}
				onChange={(e) => update({ [key]: e.target.value || undefined })}
			>
				<option value="">Any</option>
				{options.map(([v, l]) => (
					<option key={v} value={v}>{l}</option>
				))}
			</select>
		</div>
	);
	return (
		<div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4" role="search">
			<div className="sm:col-span-2">
				<label className="field-label" htmlFor="filter-q">Search</label>
				<input id="filter-q" className="field-input" type="search" placeholder="Object number, title or department" value={text} onChange={(e) => setText(e.target.value)} />
			</div>
			{select('location', 'Location', (locations.data?.locations ?? []).map((l) => [l.id, `${l.code} — ${l.name}`]))}
			{select('due', 'Next check', [['overdue', 'Overdue'], ['within-90-days', 'Due within 90 days'], ['not-set', 'Not set']])}
			{select('grade', 'Condition', [...GRADES.map((g): [string, string] => [g, CHECK_LABELS.grade[g]]), ['not-checked', 'Not checked yet']])}
			{select('priority', 'Priority', [...PRIORITIES.map((p): [string, string] => [p, CHECK_LABELS.priority[p]]), ['not-set', 'Not set']])}
			{select('check', 'Open check', CHECK_FILTERS.map((s) => [s, CHECK_LABELS.state[s]]))}
			{select('flammable', 'Flammable fluid', [['yes', 'Spirit, or unknown fluid']])}
			{select('preservative', 'Preservative', PRESERVATIVE_KINDS.map((k) => [k, LABELS.preservative[k]]))}
			{select('seal', 'Seal', SEAL_TYPES.map((k) => [k, LABELS.seal[k]]))}
			{select('shape', 'Jar shape', CONTAINER_SHAPES.map((k) => [k, LABELS.shape[k]]))}
			{select('hazard', 'Hazard', HAZARD_FLAGS.map((k) => [k, LABELS.hazard[k]]))}
			{query.department && (
				<div className="flex items-end sm:col-span-2">
					<p className="flex min-h-touch items-center gap-2 rounded-md border border-glass-300 bg-glass-50 px-3 text-sm" data-testid="filter-department">
						<span>Collection: <strong>{query.department}</strong></span>
						<button type="button" className="font-semibold text-glass-700 underline" onClick={() => update({ department: undefined })}>Remove</button>
					</p>
				</div>
			)}
		</div>
	);
}
