import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { QueryRoot } from '../QueryRoot.tsx';
import { api } from '../../lib/client/api.ts';
import { OverviewQuerySchema, type Overview, type OverviewQuery } from '../../lib/overview/schema.ts';
import { Counts } from './Counts.tsx';
import { FluidLoss } from './FluidLoss.tsx';
import { Inventory } from './Inventory.tsx';
import { AirspaceRisk } from './AirspaceRisk.tsx';

/**
 * The collection overview (the curator's home): condition, priorities, overdue and open checks,
 * hazards, the jars losing fluid fastest, the spirit in each store against its limit, and the jars
 * whose airspace is too small for their store. The collection and location filters live in the
 * address, so a filtered overview can be bookmarked; every figure links to the register view of
 * the jars it counts.
 */
export default function CollectionOverview({ testId }: { testId?: string }) {
	return (
		<QueryRoot>
			<OverviewBody testId={testId} />
		</QueryRoot>
	);
}

function readFilters(): OverviewQuery {
	const p = new URLSearchParams(window.location.search);
	const parsed = OverviewQuerySchema.safeParse({ collection: p.get('collection') ?? undefined, location: p.get('location') ?? undefined });
	return parsed.success ? parsed.data : {};
}

const toSearch = (f: OverviewQuery) => new URLSearchParams(Object.entries(f).filter((e): e is [string, string] => !!e[1])).toString();

function useFilters() {
	const [filters, setFilters] = useState<OverviewQuery>(readFilters);
	useEffect(() => {
		const onPop = () => setFilters(readFilters());
		window.addEventListener('popstate', onPop);
		return () => window.removeEventListener('popstate', onPop);
	}, []);
	const update = (change: OverviewQuery) => {
		const next = { ...filters, ...change };
		const search = toSearch(next);
		window.history.pushState(null, '', search ? `?${search}` : window.location.pathname);
		setFilters(next);
	};
	return { filters, update };
}

function OverviewBody({ testId }: { testId?: string }) {
	const { filters, update } = useFilters();
	const search = toSearch(filters);
	const q = useQuery({ queryKey: ['overview', search], queryFn: () => api<Overview>(`/api/overview${search ? `?${search}` : ''}`), placeholderData: keepPreviousData });
	if (q.isPending) return <p className="text-ink-600" role="status">Loading the overview…</p>;
	if (q.isError) return <p className="notice-error" role="alert">The overview could not be loaded: {q.error.message}</p>;
	const o = q.data;
	return (
		<div className="space-y-6" data-testid={testId ?? 'overview'}>
			<section className="card grid gap-3 sm:grid-cols-[1fr_1fr_auto]" aria-label="Filters" role="search">
				<div>
					<label className="field-label" htmlFor="ov-collection">Collection</label>
					<select id="ov-collection" className="field-input" value={filters.collection ?? ''} onChange={(e) => update({ collection: e.target.value || undefined })}>
						<option value="">All collections</option>
						{o.collections.map((c) => <option key={c} value={c}>{c}</option>)}
					</select>
				</div>
				<div>
					<label className="field-label" htmlFor="ov-location">Location</label>
					<select id="ov-location" className="field-input" value={filters.location ?? ''} onChange={(e) => update({ location: e.target.value || undefined })}>
						<option value="">All locations</option>
						{o.locations.map((l) => <option key={l.id} value={l.id}>{`${l.code} — ${l.name}`}</option>)}
					</select>
				</div>
				<p className="self-end pb-2 text-sm text-ink-600" aria-live="polite">
					{q.isFetching ? 'Updating…' : `${o.specimens.toLocaleString('en-GB')} specimens · as of ${o.asOf}`}
				</p>
			</section>
			<Counts o={o} filters={filters} />
			<FluidLoss loss={o.fluidLoss} />
			<Inventory rows={o.inventory} collection={filters.collection ?? null} filters={filters} />
			<AirspaceRisk airspace={o.airspace} />
		</div>
	);
}
