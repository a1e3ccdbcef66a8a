import { createHash } from 'node:crypto';
import { OptimisticLockError, UniqueConstraintError, type Transaction } from 'sequelize';
import { db } from '../db.ts';
import { Specimen, StorageLocation } from '../models/index.ts';
import { audit } from '../audit.ts';
import { specimenView } from './presenter.ts';
import { ImportError, readCsvFile, type CsvFile } from './importFile.ts';
import { changedFields } from '../../specimen/diff.ts';
import {
	completeMapping,
	fieldOfKey,
	guessMapping,
	objectNumberOf,
	rowToSpecimen,
	ROW_STATUSES,
	type ImportMapping,
	type ImportPreview,
	type ImportResult,
	type ImportRow,
} from '../../specimen/csvImport.ts';
import { SpecimenSchema, type Specimen as SpecimenRecord } from '../../specimen/schema.ts';
import type { SpecimenView } from '../../specimen/view.ts';

/**
 * Importing the register from CSV: a preview that says what each row would do, and a commit that
 * checks the whole file again inside one transaction and writes all of it or nothing. Rows match
 * records by object number, so importing the same file twice updates instead of duplicating.
 */
export { ImportError } from './importFile.ts';

interface Actor {
	id: string;
	clientAddress: string | null;
}

type Action =
	| { kind: 'create'; value: SpecimenRecord }
	| { kind: 'update'; specimen: Specimen; value: SpecimenRecord };

interface Plan {
	preview: ImportPreview;
	actions: Action[];
	locations: Map<string, StorageLocation>;
}

export async function previewImport(csvText: string, mapping?: ImportMapping): Promise<ImportPreview> {
	return (await plan(readCsvFile(csvText), mapping)).preview;
}

export type CommitOutcome = { ok: true; result: ImportResult } | { ok: false; preview: ImportPreview };

export async function commitImport(actor: Actor, csvText: string, mapping: ImportMapping): Promise<CommitOutcome> {
	const file = readCsvFile(csvText);
	try {
		return await db().transaction(async (transaction) => {
			// Checked again here, with the matched records locked: the preview may be minutes old.
			const p = await plan(file, mapping, transaction);
			if (p.preview.counts.error > 0) return { ok: false, preview: p.preview };
			for (const action of p.actions) await apply(actor, action, p.locations, transaction);
			const result: ImportResult = {
				created: p.preview.counts.new,
				updated: p.preview.counts.update,
				unchanged: p.preview.counts.unchanged,
				sha256: createHash('sha256').update(csvText, 'utf8').digest('hex'),
			};
			await audit({ action: 'specimen.import', entityType: 'specimen-import', entityId: result.sha256, actorId: actor.id, after: { ...result, rows: file.rows.length }, clientAddress: actor.clientAddress }, transaction);
			return { ok: true, result };
		});
	} catch (err) {
		if (err instanceof UniqueConstraintError || err instanceof OptimisticLockError) {
			throw new ImportError(409, 'Someone changed the register while the import ran, so nothing was imported; check the preview again.');
		}
		throw err;
	}
}

async function plan(file: CsvFile, requested: ImportMapping | undefined, transaction?: Transaction): Promise<Plan> {
	const complete = completeMapping(file.headers, requested ?? guessMapping(file.headers));
	if (!complete.ok) throw new ImportError(400, complete.error);
	const mapping = complete.value;
	const locations = new Map((await StorageLocation.findAll({ transaction })).map((l) => [l.id, l]));
	const idByCode = new Map([...locations.values()].map((l) => [l.code, l.id]));
	const numbers = file.rows.map((r) => objectNumberOf(r.cells, mapping));
	const existing = await findByNumbers(numbers, transaction);
	const rowsOf = rowsByNumber(file, numbers);
	const objectColumn = Object.keys(mapping).find((h) => mapping[h] === 'object_number') ?? 'object_number';

	const rows: ImportRow[] = [];
	const actions: Action[] = [];
	file.rows.forEach((r, i) => {
		const number = numbers[i]!;
		const errors = [...r.problems];
		const others = (rowsOf.get(number) ?? []).filter((n) => n !== r.row);
		if (others.length) errors.push(`${objectColumn}: ${number} is in ${listRows(others)} too; each specimen once per file.`);
		const found = existing.get(number);
		if (found?.deletedAt) errors.push(`${objectColumn}: ${number} belongs to a deleted record; choose another number.`);
		const base = found && !found.deletedAt ? recordOf(found) : undefined;
		const read = rowToSpecimen(r.cells, mapping, idByCode, base);
		if (!read.ok) errors.push(...read.errors);
		if (errors.length || !read.ok) {
			rows.push({ row: r.row, objectNumber: number, status: 'error', errors, changes: [] });
			return;
		}
		if (!found || !base) {
			actions.push({ kind: 'create', value: read.value });
			rows.push({ row: r.row, objectNumber: number, status: 'new', errors: [], changes: [] });
			return;
		}
		const columns = changedFields(stored(base), stored(read.value)).map((c) => columnOf(mapping, c.field));
		if (columns.length) actions.push({ kind: 'update', specimen: found, value: read.value });
		rows.push({ row: r.row, objectNumber: number, status: columns.length ? 'update' : 'unchanged', errors: [], changes: columns });
	});
	const counts = Object.fromEntries(ROW_STATUSES.map((s) => [s, rows.filter((r) => r.status === s).length])) as ImportPreview['counts'];
	const samples = file.headers.map((h) => file.rows.find((r) => r.cells[h]?.trim())?.cells[h]?.trim().slice(0, 80) ?? '');
	return { preview: { headers: file.headers, samples, mapping, rows, counts }, actions, locations };
}

/** The rows each object number stands in, to find the numbers a file has more than once. */
function rowsByNumber(file: CsvFile, numbers: string[]): Map<string, number[]> {
	const out = new Map<string, number[]>();
	file.rows.forEach((r, i) => {
		const n = numbers[i]!;
		if (n === '') return;
		const list = out.get(n);
		if (list) list.push(r.row);
		else out.set(n, [r.row]);
	});
	return out;
}

/** A few row numbers, not thousands: a file with one number on every row must not make a huge preview. */
function listRows(rows: number[]): string {
	const shown = rows.slice(0, 5).join(', ');
	return rows.length > 5 ? `rows ${shown} and ${rows.length - 5} more` : `row${rows.length > 1 ? 's' : ''} ${shown}`;
}

/** Existing records by object number, deleted ones too (their numbers stay taken); locked in a commit. */
async function findByNumbers(numbers: string[], transaction?: Transaction): Promise<Map<string, Specimen>> {
	const wanted = [...new Set(numbers.filter((n) => n !== ''))];
	const out = new Map<string, Specimen>();
	for (let i = 0; i < wanted.length; i += 1000) {
		const found = await Specimen.findAll({
			where: { objectNumber: wanted.slice(i, i + 1000) },
			paranoid: false,
			transaction,
			lock: transaction ? transaction.LOCK.UPDATE : undefined,
		});
		for (const s of found) out.set(s.objectNumber, s);
	}
	return out;
}

async function apply(actor: Actor, action: Action, locations: Map<string, StorageLocation>, transaction: Transaction) {
	const value = stored(action.value);
	const who = { actorId: actor.id, clientAddress: actor.clientAddress, entityType: 'specimen' };
	if (action.kind === 'create') {
		const s = await Specimen.create({ ...value, deletedAt: null }, { transaction });
		await audit({ ...who, action: 'specimen.import-create', entityId: s.id, after: viewOf(s, locations) }, transaction);
		return;
	}
	const s = action.specimen;
	const before = viewOf(s, locations);
	// Instance save, so the model's version check applies (a static update would skip it).
	s.set(value);
	await s.save({ transaction });
	const after = viewOf(s, locations);
	const changes = changedFields(before, after, ['version', 'updatedAt']);
	const pick = (v: SpecimenView) => Object.fromEntries(changes.map((c) => [c.field, v[c.field as keyof SpecimenView]]));
	await audit({ ...who, action: 'specimen.import-update', entityId: s.id, before: pick(before), after: pick(after) }, transaction);
}

/** The record as the API shows it, its location taken from the list already loaded. */
function viewOf(s: Specimen, locations: Map<string, StorageLocation>): SpecimenView {
	const l = s.storageLocationId ? locations.get(s.storageLocationId) : undefined;
	return { ...specimenView(s), storageLocation: l ? { id: l.id, code: l.code, name: l.name } : null };
}

/**
 * A stored record in the shape the schema gives an imported row, to compare the two. Only the
 * schema's own keys: the view carries more (id, version, …), which the strict schema would refuse.
 */
function recordOf(s: Specimen): SpecimenRecord {
	const view: Record<string, unknown> = { ...specimenView(s), storageLocationId: s.storageLocationId };
	return Object.fromEntries(Object.keys(SpecimenSchema.shape).map((k) => [k, view[k]])) as SpecimenRecord;
}

/**
 * A record as the database will hold it: sizes to 0.1 mm (DECIMAL(7,1)), so that a file saying
 * 90.04 matches a record of 90.0 instead of updating it on every import, and the audit says what was stored.
 */
function stored(r: SpecimenRecord): SpecimenRecord {
	const tenth = (n: number) => Math.round(n * 10) / 10;
	return {
		...r,
		innerWidthMm: tenth(r.innerWidthMm),
		innerDepthMm: r.innerDepthMm === null ? null : tenth(r.innerDepthMm),
		innerHeightMm: tenth(r.innerHeightMm),
		specimenTopMm: r.specimenTopMm === null ? null : tenth(r.specimenTopMm),
		// A fresh array for JSONB, so Sequelize sees the change (STACK.md).
		hazards: r.hazards.map((h) => ({ ...h })),
	};
}

function columnOf(mapping: ImportMapping, key: string): string {
	const field = fieldOfKey(key);
	return Object.keys(mapping).find((h) => mapping[h] === field) ?? field ?? key;
}
