import { z } from 'zod';
import { SpecimenSchema, type Specimen } from './schema.ts';
import { LABELS } from './vocabulary.ts';
import { readDate, readHazards, readLocation, readMm, readTerm, readText, undefuse, type Cell } from './csvCells.ts';

/**
 * Importing the register from a spreadsheet: the fields a column can fill, the mapping of a file's
 * columns to them, a first guess at that mapping, and one row read into a specimen record. Shared
 * by the import page (which shows the mapping) and the server (which decides).
 */

/** The importable fields, in the order the export writes its columns (csv.ts uses this list). */
export const IMPORT_FIELDS = [
	'object_number', 'title', 'description', 'department', 'location_code', 'preservative_recorded',
	'preservative_kind', 'container_shape', 'inner_width_mm', 'inner_depth_mm', 'inner_height_mm',
	'container_material', 'closure_type', 'seal_type', 'hazards', 'next_check_due', 'specimen_top_mm',
] as const;
export type ImportField = (typeof IMPORT_FIELDS)[number];
export const IGNORE = 'ignore';
export type ImportTarget = ImportField | typeof IGNORE;

/** Limits of one import: a file a person can still check row by row, and one transaction can hold. */
export const MAX_IMPORT_BYTES = 5 * 1024 * 1024;
export const MAX_IMPORT_ROWS = 20_000;
/** The file travels as a JSON string, and escaping (\" and \r\n) can double it. */
export const MAX_IMPORT_BODY_BYTES = 2 * MAX_IMPORT_BYTES + 64 * 1024;

/** CSV column name → the field it fills, or 'ignore'. Each field comes from one column at most. */
export const ImportMappingSchema = z
	.record(
		z.string().max(200, 'A column name has at most 200 characters.'),
		z.enum([...IMPORT_FIELDS, IGNORE], { error: 'Choose a field for each column, or ignore it.' }),
	)
	.refine((m) => Object.keys(m).length <= 200, 'A file has at most 200 columns.')
	.superRefine((m, ctx) => {
		for (const problem of mappingProblems(m)) ctx.addIssue({ code: 'custom', message: problem });
	});
export type ImportMapping = Record<string, ImportTarget>;

/** What is wrong with a mapping as a whole: a field filled from two columns. */
export function mappingProblems(mapping: Readonly<Record<string, ImportTarget>>): string[] {
	const columns = new Map<ImportField, string[]>();
	for (const [header, field] of Object.entries(mapping)) {
		if (field !== IGNORE) columns.set(field, [...(columns.get(field) ?? []), header]);
	}
	return [...columns]
		.filter(([, headers]) => headers.length > 1)
		.map(([field, headers]) => `The columns ${headers.map((h) => `“${h}”`).join(' and ')} are ${headers.length === 2 ? 'both' : 'all'} mapped to ${field}; map each field from one column only.`);
}

/** The fields a new specimen cannot do without (an update keeps what the record has). */
export const REQUIRED_FIELDS: readonly ImportField[] = [
	'object_number', 'title', 'preservative_kind', 'container_shape', 'inner_width_mm', 'inner_height_mm',
	'container_material', 'closure_type', 'seal_type',
];

export const PreviewBodySchema = z.object({ csv: z.string(), mapping: ImportMappingSchema.optional() }).strict();
export const CommitBodySchema = z.object({ csv: z.string(), mapping: ImportMappingSchema }).strict();

/** Names compared without case, spaces, punctuation or a trailing unit "mm". */
const normal = (s: string) => s.toLowerCase().replace(/[^a-z0-9]/g, '').replace(/mm$/, '');

/** Other names people give these columns (compared after `normal`). */
const SYNONYMS: Partial<Record<ImportField, string[]>> = {
	object_number: ['object number', 'object no', 'accession number', 'accession no', 'catalogue number', 'catalog number', 'inventory number', 'registration number'],
	title: ['name', 'object name', 'specimen'],
	location_code: ['location', 'storage location', 'store'],
	preservative_recorded: ['preservative', 'fluid', 'fluid recorded'],
	preservative_kind: ['fluid kind', 'preservative type'],
	container_shape: ['shape', 'jar shape'],
	inner_width_mm: ['width', 'diameter', 'inner diameter'],
	inner_depth_mm: ['depth'],
	inner_height_mm: ['height'],
	specimen_top_mm: ['specimen top', 'top of specimen'],
	container_material: ['material', 'jar material', 'glass'],
	closure_type: ['closure', 'lid'],
	seal_type: ['seal'],
	hazards: ['hazard'],
	next_check_due: ['next check', 'next check date', 'due'],
	department: ['dept', 'collection'],
};

const NAMES: ReadonlyMap<string, ImportField> = new Map(
	IMPORT_FIELDS.flatMap((f) => [f, ...(SYNONYMS[f] ?? [])].map((name) => [normal(name), f] as const)),
);

/** A first guess at the mapping: each header whose name is a field's (or a synonym's); the first one wins. */
export function guessMapping(headers: readonly string[]): ImportMapping {
	const taken = new Set<ImportField>();
	const out: ImportMapping = {};
	for (const header of headers) {
		const field = NAMES.get(normal(header));
		out[header] = field && !taken.has(field) ? field : IGNORE;
		if (field) taken.add(field);
	}
	return out;
}

/**
 * A mapping for every column of the file: the person's choice where they made one, 'ignore' for
 * the rest. A column the file does not have is a mistake worth saying, not something to skip.
 */
export function completeMapping(headers: readonly string[], mapping: Readonly<Record<string, ImportTarget>>): Cell<ImportMapping> {
	const unknown = Object.keys(mapping).filter((h) => !headers.includes(h));
	if (unknown.length) return { ok: false, error: `The file has no column named ${unknown.map((h) => `“${h}”`).join(', ')}; choose the file again.` };
	return { ok: true, value: Object.fromEntries(headers.map((h) => [h, Object.hasOwn(mapping, h) ? mapping[h]! : IGNORE])) };
}

type Key = keyof Specimen;
type Reader = (cell: string, locationsByCode: ReadonlyMap<string, string>) => Cell<unknown>;

/** Each field: the record's key it fills and how its cell is read. */
const FIELDS: Record<ImportField, { key: Key; read: Reader }> = {
	object_number: { key: 'objectNumber', read: readText },
	title: { key: 'title', read: readText },
	description: { key: 'description', read: readText },
	department: { key: 'department', read: readText },
	location_code: { key: 'storageLocationId', read: readLocation },
	preservative_recorded: { key: 'preservativeRecorded', read: readText },
	preservative_kind: { key: 'preservativeKind', read: (c) => readTerm(c, LABELS.preservative) },
	container_shape: { key: 'containerShape', read: (c) => readTerm(c, LABELS.shape) },
	inner_width_mm: { key: 'innerWidthMm', read: (c) => readMm(c, true) },
	inner_depth_mm: { key: 'innerDepthMm', read: (c) => readMm(c, false) },
	inner_height_mm: { key: 'innerHeightMm', read: (c) => readMm(c, true) },
	specimen_top_mm: { key: 'specimenTopMm', read: (c) => readMm(c, false) },
	container_material: { key: 'containerMaterial', read: (c) => readTerm(c, LABELS.material) },
	closure_type: { key: 'closureType', read: (c) => readTerm(c, LABELS.closure) },
	seal_type: { key: 'sealType', read: (c) => readTerm(c, LABELS.seal) },
	hazards: { key: 'hazards', read: readHazards },
	next_check_due: { key: 'nextCheckDue', read: readDate },
};
const FIELD_OF = new Map<string, ImportField>(IMPORT_FIELDS.map((f) => [FIELDS[f].key, f]));

/** The import field that fills a record key (for naming changes by column). */
export const fieldOfKey = (key: string): ImportField | undefined => FIELD_OF.get(key);

/** The cell of the object-number column, read as rowToSpecimen reads it (for matching records). */
export function objectNumberOf(row: CsvRow, mapping: Readonly<Record<string, ImportTarget>>): string {
	const header = Object.keys(mapping).find((h) => mapping[h] === 'object_number');
	return header === undefined ? '' : undefuse(cellOf(row, header));
}

/** One data row: column name → cell text. */
export type CsvRow = Readonly<Record<string, string>>;
export type RowResult = { ok: true; value: Specimen } | { ok: false; errors: string[] };

const cellOf = (row: CsvRow, header: string) => (Object.hasOwn(row, header) ? row[header]! : '');

/**
 * One row as a specimen record, checked with the same schema as the form. `base` is the record
 * this row updates, if any: fields no column fills keep its values, so a file with only a few
 * columns updates only those. Every error starts with the column it is about.
 */
export function rowToSpecimen(
	row: CsvRow,
	mapping: Readonly<Record<string, ImportTarget>>,
	locationsByCode: ReadonlyMap<string, string>,
	base?: Specimen,
): RowResult {
	const input: Record<string, unknown> = { ...base };
	const columnOf = new Map<string, string>();
	const failed = new Set<string>();
	const errors: string[] = [];
	for (const [header, field] of Object.entries(mapping)) {
		if (field === IGNORE) continue;
		const { key, read } = FIELDS[field];
		columnOf.set(key, header);
		const cell = read(undefuse(cellOf(row, header)), locationsByCode);
		if (cell.ok) input[key] = cell.value;
		else {
			failed.add(key);
			errors.push(`${header}: ${cell.error}`);
		}
	}
	for (const field of REQUIRED_FIELDS) {
		const { key } = FIELDS[field];
		if (input[key] !== undefined || failed.has(key)) continue;
		failed.add(key);
		errors.push(`${field} (no column): A new specimen needs this field; map a column to it.`);
	}
	const parsed = SpecimenSchema.safeParse(input, { error: schemaMessage });
	if (parsed.success && errors.length === 0) return { ok: true, value: parsed.data };
	for (const issue of parsed.error?.issues ?? []) {
		const key = String(issue.path[0] ?? '');
		// A cell that could not be read is reported once, by its reader.
		if (failed.has(key)) continue;
		const column = columnOf.get(key);
		errors.push(`${column ?? `${FIELD_OF.get(key) ?? key} (no column)`}: ${issue.message}`);
	}
	return { ok: false, errors };
}

/** Plainer words than zod's default for a text too long (the schema leaves that one to zod). */
function schemaMessage(issue: { code?: string; origin?: string; maximum?: unknown }): string | undefined {
	return issue.code === 'too_big' && issue.origin === 'string' ? `Has more than ${String(issue.maximum)} characters.` : undefined;
}

export const ROW_STATUSES = ['new', 'update', 'unchanged', 'error'] as const;
export type RowStatus = (typeof ROW_STATUSES)[number];

/** One row of the preview; `row` counts as a spreadsheet does, the header being row 1. */
export interface ImportRow {
	row: number;
	objectNumber: string;
	status: RowStatus;
	errors: string[];
	/** For an update: the columns whose values differ from the record. */
	changes: string[];
}

export interface ImportPreview {
	headers: string[];
	/** The first non-empty cell of each column, to help choose its field. */
	samples: string[];
	mapping: ImportMapping;
	rows: ImportRow[];
	counts: Record<RowStatus, number>;
}

export interface ImportResult {
	created: number;
	updated: number;
	unchanged: number;
	sha256: string;
}

/** What is wrong with a chosen file before it is read: the page says so without sending it. */
export function fileProblem(file: { name: string; size: number }): string | null {
	if (!/\.csv$/i.test(file.name)) return `“${file.name}” is not a .csv file; save the spreadsheet as CSV (UTF-8) first.`;
	if (file.size > MAX_IMPORT_BYTES) return `“${file.name}” is larger than ${MAX_IMPORT_BYTES / 1024 / 1024} MB; split it into smaller files.`;
	if (file.size === 0) return `“${file.name}” is empty.`;
	return null;
}
