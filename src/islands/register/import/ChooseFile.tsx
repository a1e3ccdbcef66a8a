import { useState } from 'react';
import type { ApiError } from '../../../lib/client/api.ts';
import { fileProblem, MAX_IMPORT_BYTES, MAX_IMPORT_ROWS } from '../../../lib/specimen/csvImport.ts';
import { ApiProblem } from './ApiProblem.tsx';

/** Step 1: a CSV file from this computer, read here and checked for its kind and size before it is sent. */
export function ChooseFile(props: { busy: boolean; serverError: ApiError | null; onRead: (f: { name: string; csv: string }) => void }) {
	const [problem, setProblem] = useState<string | null>(null);
	async function choose(file: File | undefined) {
		setProblem(null);
		if (!file) return;
		const p = fileProblem(file);
		if (p) return setProblem(p);
		try {
			props.onRead({ name: file.name, csv: await file.text() });
		} catch {
			setProblem(`“${file.name}” could not be read; choose it again.`);
		}
	}
	return (
		<div className="mt-3 max-w-2xl space-y-3">
			<p className="text-sm text-ink-700">
				The first row must name the columns. A file exported from the register can be imported as it is; for another
				spreadsheet you say in the next step which column holds what. At most {MAX_IMPORT_BYTES / 1024 / 1024} MB and {MAX_IMPORT_ROWS.toLocaleString('en-GB')} rows.
			</p>
			<div>
				<label className="field-label" htmlFor="import-file">CSV file</label>
				<input
					id="import-file"
					type="file"
					accept=".csv,text/csv"
					className="field-input py-2"
					disabled={props.busy}
					aria-describedby="import-file-hint"
					aria-invalid={problem ? true : undefined}
					onChange={(e) => void choose(e.target.files?.[0])}
				/>
				<p id="import-file-hint" className="mt-1 text-xs text-ink-600">Save it from the spreadsheet as “CSV UTF-8”.</p>
			</div>
			<div aria-live="polite">
				{props.busy && <p role="status">Reading the rows…</p>}
				{problem && <p className="notice-error" role="alert">{problem}</p>}
				{!problem && <ApiProblem error={props.serverError} />}
			</div>
		</div>
	);
}
