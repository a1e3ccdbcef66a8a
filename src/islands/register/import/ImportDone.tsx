import type { ImportResult } from '../../../lib/specimen/csvImport.ts';

/** Step 4: what the import did. */
export function ImportDone({ result, onAgain }: { result: ImportResult; onAgain: () => void }) {
	const n = (k: number, one: string, many: string) => `${k.toLocaleString('en-GB')} ${k === 1 ? one : many}`;
	return (
		<div className="mt-3 space-y-4">
			<p className="notice-info" role="status" data-testid="import-result">
				Imported: {n(result.created, 'specimen registered', 'specimens registered')}, {n(result.updated, 'record updated', 'records updated')},{' '}
				{n(result.unchanged, 'row', 'rows')} already as in the register.
			</p>
			<p className="text-sm text-ink-700">Each new and changed record has the import in its history.</p>
			<div className="flex flex-wrap gap-3">
				<a className="btn-primary" href="/specimens">Back to the register</a>
				<button className="btn-secondary" type="button" onClick={onAgain}>Import another file</button>
			</div>
		</div>
	);
}
