import type { ApiError } from '../../../lib/client/api.ts';
import {
	IGNORE,
	IMPORT_FIELDS,
	mappingProblems,
	REQUIRED_FIELDS,
	type ImportField,
	type ImportMapping,
	type ImportPreview,
	type ImportTarget,
} from '../../../lib/specimen/csvImport.ts';
import { ApiProblem } from './ApiProblem.tsx';

/** The fields as people say them (the export's column names are in the value of each option). */
const FIELD_LABELS: Record<ImportField, string> = {
	object_number: 'Object number',
	title: 'Title',
	description: 'Description',
	department: 'Department',
	location_code: 'Storage location (code)',
	preservative_recorded: 'Preservative as recorded',
	preservative_kind: 'Preservative kind',
	container_shape: 'Container shape',
	inner_width_mm: 'Inner width or diameter (mm)',
	inner_depth_mm: 'Inner depth or minor axis (mm)',
	inner_height_mm: 'Inner height (mm)',
	container_material: 'Container material',
	closure_type: 'Closure',
	seal_type: 'Seal',
	hazards: 'Hazards',
	next_check_due: 'Next check due (YYYY-MM-DD)',
	specimen_top_mm: 'Top of the specimen (mm above the inner base)',
};

/** Step 2: for each column of the file, the field it fills, starting from the server's guess. */
export function MapColumns(props: {
	preview: ImportPreview;
	mapping: ImportMapping;
	onChange: (m: ImportMapping) => void;
	busy: boolean;
	error: ApiError | null;
	onBack: () => void;
	onNext: () => void;
}) {
	const { preview, mapping } = props;
	const mapped = new Set(Object.values(mapping));
	const problems = [
		...(mapped.has('object_number') ? [] : ['Choose the column that holds the object number: rows are matched to records by it.']),
		...mappingProblems(mapping),
	];
	const missing = REQUIRED_FIELDS.filter((f) => !mapped.has(f));
	const set = (header: string, target: ImportTarget) => props.onChange({ ...mapping, [header]: target });
	return (
		<div className="mt-3 space-y-4">
			<p className="max-w-3xl text-sm text-ink-700">
				Each column of the file fills one field of the record, or is ignored. The choices below are a guess from the column
				names; check them against the first value of each column.
			</p>
			<div className="overflow-x-auto">
				<table className="w-full min-w-[40rem] text-left text-sm">
					<caption className="sr-only">Columns of the file and the fields they fill</caption>
					<thead className="text-ink-600">
						<tr>
							<th scope="col" className="py-2 pr-3">Column in the file</th>
							<th scope="col" className="py-2 pr-3">First value</th>
							<th scope="col" className="py-2">Fills the field</th>
						</tr>
					</thead>
					<tbody>
						{preview.headers.map((h, i) => (
							<tr key={h} className="border-t border-ink-100 align-middle">
								<th scope="row" className="py-2 pr-3 font-semibold">{h}</th>
								<td className="max-w-[16rem] truncate py-2 pr-3 text-ink-700" title={preview.samples[i]}>{preview.samples[i] || '—'}</td>
								<td className="py-2">
									<label className="sr-only" htmlFor={`map-${i}`}>Field for the column “{h}”</label>
									<select id={`map-${i}`} className="field-input mt-0" value={mapping[h] ?? IGNORE} onChange={(e) => set(h, e.target.value as ImportTarget)}>
										<option value={IGNORE}>Ignore this column</option>
										{IMPORT_FIELDS.map((f) => (
											<option key={f} value={f}>{FIELD_LABELS[f]}</option>
										))}
									</select>
								</td>
							</tr>
						))}
					</tbody>
				</table>
			</div>
			<div aria-live="polite" className="space-y-2">
				{problems.map((p) => (
					<p key={p} className="notice-error">{p}</p>
				))}
				{missing.length > 0 && !problems.length && (
					<p className="notice-caution">
						No column fills {missing.map((f) => FIELD_LABELS[f].toLowerCase()).join(', ')}. Rows that update a record keep what it
						has; rows for new specimens will be refused without them.
					</p>
				)}
				<ApiProblem error={props.error} />
			</div>
			<div className="flex flex-wrap gap-3">
				<button className="btn-primary" type="button" disabled={problems.length > 0 || props.busy} onClick={props.onNext}>
					{props.busy ? 'Checking the rows…' : 'Check the rows'}
				</button>
				<button className="btn-secondary" type="button" onClick={props.onBack}>Choose another file</button>
			</div>
		</div>
	);
}
