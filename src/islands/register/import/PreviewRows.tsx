import { useState } from 'react';
import type { ApiError } from '../../../lib/client/api.ts';
import { ROW_STATUSES, type ImportPreview, type RowStatus } from '../../../lib/specimen/csvImport.ts';
import { ApiProblem } from './ApiProblem.tsx';

/** Rows on one page of the preview: enough to scan, few enough for a tablet. */
const PAGE = 100;

const STATUS: Record<RowStatus, { label: string; plural: string; badge: string }> = {
	new: { label: 'New', plural: 'new specimens', badge: 'border-glass-600 bg-glass-50 text-glass-900' },
	update: { label: 'Update', plural: 'updates', badge: 'border-spirit-500 bg-spirit-50 text-spirit-900' },
	unchanged: { label: 'Unchanged', plural: 'unchanged', badge: 'border-ink-300 bg-ink-50 text-ink-700' },
	error: { label: 'Error', plural: 'with errors', badge: 'border-alert-600 bg-alert-50 text-alert-700' },
};

/**
 * Step 3: what each row would do, a page of rows at a time, with the errors of each; the import
 * button stays disabled while any row has an error, since the file is imported whole or not at all.
 */
export function PreviewRows(props: {
	preview: ImportPreview;
	committing: boolean;
	error: ApiError | null;
	onBack: () => void;
	onChooseAgain: () => void;
	onCommit: () => void;
}) {
	const { preview } = props;
	const errors = preview.counts.error;
	const [show, setShow] = useState<RowStatus | 'all'>(errors ? 'error' : 'all');
	const [page, setPage] = useState(0);
	const rows = show === 'all' ? preview.rows : preview.rows.filter((r) => r.status === show);
	const pages = Math.max(1, Math.ceil(rows.length / PAGE));
	const at = Math.min(page, pages - 1);
	const shown = rows.slice(at * PAGE, (at + 1) * PAGE);
	const total = preview.rows.length;
	return (
		<div className="mt-3 space-y-4">
			<ul className="flex flex-wrap gap-2" aria-label="Summary" data-testid="import-summary">
				{ROW_STATUSES.map((s) => (
					<li key={s} className={`rounded-md border px-3 py-2 text-sm ${STATUS[s].badge}`}>
						<span className="text-lg font-semibold">{preview.counts[s].toLocaleString('en-GB')}</span> {STATUS[s].plural}
					</li>
				))}
			</ul>
			{errors > 0 && (
				<p className="notice-error" id="import-blocked">
					{errors === 1 ? 'One row has' : `${errors.toLocaleString('en-GB')} rows have`} errors. Correct them in the spreadsheet,
					save it as CSV again and choose it again; nothing is imported until every row is right.
				</p>
			)}
			<div className="flex flex-wrap items-end gap-3">
				<div>
					<label className="field-label" htmlFor="import-show">Show</label>
					<select
						id="import-show"
						className="field-input w-56"
						value={show}
						onChange={(e) => {
							setShow(e.target.value as RowStatus | 'all');
							setPage(0);
						}}
					>
						<option value="all">All rows ({total.toLocaleString('en-GB')})</option>
						{ROW_STATUSES.map((s) => (
							<option key={s} value={s}>{`${STATUS[s].label} (${preview.counts[s].toLocaleString('en-GB')})`}</option>
						))}
					</select>
				</div>
				<nav className="flex items-center gap-2 text-sm" aria-label="Pages of rows">
					<span>
						Rows {rows.length ? at * PAGE + 1 : 0}–{at * PAGE + shown.length} of {rows.length.toLocaleString('en-GB')}
					</span>
					<button className="btn-secondary" type="button" disabled={at === 0} onClick={() => setPage(at - 1)}>Previous</button>
					<button className="btn-secondary" type="button" disabled={at >= pages - 1} onClick={() => setPage(at + 1)}>Next</button>
				</nav>
			</div>
			<div className="overflow-x-auto">
				<table className="w-full min-w-[40rem] text-left text-sm">
					<caption className="sr-only">What each row of the file would do</caption>
					<thead className="text-ink-600">
						<tr>
							<th scope="col" className="py-2 pr-3">Row</th>
							<th scope="col" className="py-2 pr-3">Object number</th>
							<th scope="col" className="py-2 pr-3">Result</th>
							<th scope="col" className="py-2">Details</th>
						</tr>
					</thead>
					<tbody>
						{shown.map((r) => (
							<tr key={r.row} className="border-t border-ink-100 align-top" data-testid="import-row">
								<td className="py-2 pr-3 tabular-nums">{r.row}</td>
								<td className="py-2 pr-3 font-semibold">{r.objectNumber || '—'}</td>
								<td className="py-2 pr-3">
									<span className={`inline-block rounded border px-2 py-0.5 text-xs font-semibold ${STATUS[r.status].badge}`}>{STATUS[r.status].label}</span>
								</td>
								<td className="py-2">
									{r.errors.length > 0 && (
										<ul className="list-disc space-y-1 pl-4 text-alert-700">
											{r.errors.map((e, i) => (
												<li key={i}>{e}</li>
											))}
										</ul>
									)}
									{r.changes.length > 0 && <span className="text-ink-700">Changes {r.changes.join(', ')}</span>}
								</td>
							</tr>
						))}
					</tbody>
				</table>
			</div>
			<div aria-live="polite">
				<ApiProblem error={props.error} />
			</div>
			<div className="flex flex-wrap gap-3">
				<button
					className="btn-primary"
					type="button"
					disabled={errors > 0 || props.committing}
					aria-describedby={errors > 0 ? 'import-blocked' : undefined}
					onClick={props.onCommit}
				>
					{props.committing ? 'Importing…' : `Import all ${total.toLocaleString('en-GB')} rows`}
				</button>
				<button className="btn-secondary" type="button" onClick={props.onBack}>Change the columns</button>
				<button className="btn-secondary" type="button" onClick={props.onChooseAgain}>Choose another file</button>
			</div>
		</div>
	);
}
