import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { flexRender, getCoreRowModel, useReactTable, type VisibilityState } from '@tanstack/react-table';
import { useEffect, useState } from 'react';
import { QueryRoot } from '../QueryRoot.tsx';
import { api } from '../../lib/client/api.ts';
import type { RegisterPage } from '../../lib/specimen/view.ts';
import type { SortKey } from '../../lib/specimen/query.ts';
import { COLUMNS, DEFAULT_HIDDEN } from './columns.tsx';
import { Filters } from './Filters.tsx';
import { useUrlQuery } from './useUrlQuery.ts';
import { checkExportUrl } from '../../lib/check/exportQuery.ts';

/**
 * The specimen register: server-side search, filters, sort and paging (the view lives in the URL),
 * a column chooser remembered in this browser, and CSV export of the filtered view.
 */
export default function Register({ canEdit }: { canEdit: boolean }) {
	return (
		<QueryRoot>
			<Table canEdit={canEdit} />
		</QueryRoot>
	);
}

const VISIBILITY_KEY = 'meniscus.register.columns';

function Table({ canEdit }: { canEdit: boolean }) {
	const { query, update, params } = useUrlQuery();
	const [visibility, setVisibility] = useState<VisibilityState>(() => {
		try {
			return { ...DEFAULT_HIDDEN, ...JSON.parse(localStorage.getItem(VISIBILITY_KEY) ?? '{}') };
		} catch {
			return DEFAULT_HIDDEN;
		}
	});
	useEffect(() => localStorage.setItem(VISIBILITY_KEY, JSON.stringify(visibility)), [visibility]);
	const data = useQuery({
		queryKey: ['register', params.toString()],
		queryFn: () => api<RegisterPage>(`/api/specimens?${params}`),
		placeholderData: keepPreviousData,
	});
	const table = useReactTable({
		data: data.data?.rows ?? [],
		columns: COLUMNS,
		getCoreRowModel: getCoreRowModel(),
		manualSorting: true,
		manualPagination: true,
		state: { columnVisibility: visibility },
		onColumnVisibilityChange: setVisibility,
	});
	const total = data.data?.total ?? 0;
	const pages = Math.max(1, Math.ceil(total / query.pageSize));
	const sortBy = (key: SortKey) => update({ sort: key, dir: query.sort === key && query.dir === 'asc' ? 'desc' : 'asc' });

	return (
		<div className="space-y-4">
			<div className="flex flex-wrap items-center gap-3">
				{canEdit && (
					<>
						<a className="btn-primary" href="/specimens/new">Register a specimen</a>
						<a className="btn-secondary" href="/specimens/import">Import a spreadsheet</a>
					</>
				)}
				<a className="btn-secondary" href={`/api/specimens/export?${params}`} download>
					Export this view (CSV)
				</a>
				<a className="btn-secondary" href={checkExportUrl()} download>
					Export checks (CSV)
				</a>
				<details className="relative">
					<summary className="btn-secondary cursor-pointer list-none">Columns</summary>
					<div className="absolute z-10 mt-2 w-56 rounded-md border border-ink-200 bg-white p-3 shadow-lg">
						{table.getAllLeafColumns().map((c) => (
							<label key={c.id} className="flex min-h-touch items-center gap-2 text-sm">
								<input type="checkbox" checked={c.getIsVisible()} onChange={c.getToggleVisibilityHandler()} disabled={c.id === 'objectNumber'} />
								{String(c.columnDef.header)}
							</label>
						))}
					</div>
				</details>
			</div>
			<section className="card" aria-label="Filters">
				<Filters query={query} update={update} />
			</section>
			<div className="card overflow-x-auto p-0">
				<table className="w-full min-w-[48rem] text-left text-sm" aria-busy={data.isFetching}>
					<caption className="sr-only">Specimens, sorted by {query.sort} {query.dir === 'asc' ? 'ascending' : 'descending'}</caption>
					<thead className="border-b border-ink-100 bg-paper text-ink-700">
						{table.getHeaderGroups().map((g) => (
							<tr key={g.id}>
								{g.headers.map((h) => {
									const sort = (h.column.columnDef.meta as { sort?: SortKey } | undefined)?.sort;
									const active = sort && query.sort === sort;
									return (
										<th key={h.id} scope="col" className="px-3 py-2 font-semibold" aria-sort={active ? (query.dir === 'asc' ? 'ascending' : 'descending') : undefined}>
											{sort ? (
												<button type="button" className="flex min-h-touch items-center gap-1 hover:text-glass-700" onClick={() => sortBy(sort)}>
													{flexRender(h.column.columnDef.header, h.getContext())}
													<span aria-hidden="true">{active ? (query.dir === 'asc' ? '▲' : '▼') : '↕'}</span>
												</button>
											) : (
												flexRender(h.column.columnDef.header, h.getContext())
											)}
										</th>
									);
								})}
							</tr>
						))}
					</thead>
					<tbody>
						{table.getRowModel().rows.map((r) => (
							<tr key={r.id} className="border-t border-ink-100 hover:bg-glass-50/50" data-testid="register-row">
								{r.getVisibleCells().map((c) => (
									<td key={c.id} className="px-3 py-2 align-top">
										{flexRender(c.column.columnDef.cell, c.getContext())}
									</td>
								))}
							</tr>
						))}
					</tbody>
				</table>
				{data.isError && <p className="notice-error m-4" role="alert">{data.error.message}</p>}
				{data.isSuccess && total === 0 && (
					<p className="m-4 rounded-md border border-dashed border-ink-200 bg-paper px-4 py-6">
						No specimen matches this view. Clear a filter, or {canEdit ? 'register the jar.' : 'ask a conservator to register the jar.'}
					</p>
				)}
			</div>
			<nav className="flex flex-wrap items-center justify-between gap-3 text-sm" aria-label="Pages">
				<span data-testid="register-total">
					{total.toLocaleString('en-GB')} specimen{total === 1 ? '' : 's'} · page {query.page} of {pages}
				</span>
				<div className="flex items-center gap-2">
					<label htmlFor="page-size">Rows per page</label>
					<select id="page-size" className="field-input mt-0 w-24" value={query.pageSize} onChange={(e) => update({ pageSize: Number(e.target.value) })}>
						{[25, 50, 100, 200].map((n) => (
							<option key={n}>{n}</option>
						))}
					</select>
					<button className="btn-secondary" type="button" disabled={query.page <= 1} onClick={() => update({ page: query.page - 1 })}>
						Previous
					</button>
					<button className="btn-secondary" type="button" disabled={query.page >= pages} onClick={() => update({ page: query.page + 1 })}>
						Next
					</button>
				</div>
			</nav>
		</div>
	);
}
