/**
 * Bringing stored mark layers forward. A layer is stored whole with its `schemaVersion`; when the
 * shape of a layer changes, MARK_SCHEMA_VERSION goes up by one and a step `{ from: n, to: n + 1 }`
 * is added to MIGRATIONS that rewrites a version-n layer as version n + 1. Reading a layer applies
 * the steps from its version up to the current one, then validates the result with the schema, so
 * every caller gets a current, valid MarkLayer or a clear error. These are separate from database
 * migrations: old layers are upgraded when read, not rewritten in place.
 *
 * Version 1 is the first, so MIGRATIONS is empty today; the machinery is tested with injected steps.
 */
import { z } from 'zod';
import { MARK_SCHEMA_VERSION, MarkLayerSchema, type MarkLayer } from './schema.ts';

/** A layer as stored, before it is known to be valid. */
export type RawLayer = Record<string, unknown>;

export interface MigrationStep {
	from: number;
	to: number;
	/**
	 * Rewrites a layer of version `from` as version `to`. Must be pure: it gets a private copy and
	 * returns the new layer. It need not set `schemaVersion`; the runner does.
	 */
	up(raw: RawLayer): RawLayer;
}

/** The steps from each past version to the next, oldest first. */
export const MIGRATIONS: readonly MigrationStep[] = [];

/** Why a stored layer could not be read; `issues` holds the schema's findings when validation failed. */
export class LayerMigrationError extends Error {
	override readonly name = 'LayerMigrationError';
	readonly issues: readonly z.core.$ZodIssue[];
	constructor(message: string, options?: { cause?: unknown; issues?: readonly z.core.$ZodIssue[] }) {
		super(message, options?.cause === undefined ? undefined : { cause: options.cause });
		this.issues = options?.issues ?? [];
	}
}

const isRecord = (v: unknown): v is RawLayer => typeof v === 'object' && v !== null && !Array.isArray(v);

function copy(raw: RawLayer): RawLayer {
	// Steps may then be written as plain rewrites without touching the caller's object.
	try {
		return structuredClone(raw);
	} catch (cause) {
		throw new LayerMigrationError('A mark layer must be plain JSON data.', { cause });
	}
}

/** The registry as a map from version to step, refusing gaps in the numbering and duplicates. */
function index(steps: readonly MigrationStep[]): Map<number, MigrationStep> {
	const byFrom = new Map<number, MigrationStep>();
	for (const s of steps) {
		// A broken registry is a programming error; say so rather than misread a layer.
		if (!Number.isInteger(s.from) || s.to !== s.from + 1) throw new Error(`A layer migration must go from one version to the next; this one goes from ${s.from} to ${s.to}.`);
		if (byFrom.has(s.from)) throw new Error(`Two layer migrations start from version ${s.from}.`);
		byFrom.set(s.from, s);
	}
	return byFrom;
}

/**
 * Applies the steps that bring `raw` from its schemaVersion up to `current`, without validating
 * the result (migrateLayerWith does). Exported so the runner can be tested past version 1.
 */
export function migrateRaw(raw: unknown, steps: readonly MigrationStep[], current: number): RawLayer {
	if (!isRecord(raw)) throw new LayerMigrationError('A mark layer must be a JSON object.');
	const byFrom = index(steps);
	if (!('schemaVersion' in raw) || raw.schemaVersion === undefined || raw.schemaVersion === null) {
		throw new LayerMigrationError('This layer has no schemaVersion, so Meniscus cannot tell which version wrote it.');
	}
	const version = raw.schemaVersion;
	if (typeof version !== 'number' || !Number.isInteger(version) || version < 0) {
		throw new LayerMigrationError(`This layer's schemaVersion must be a whole number, not ${JSON.stringify(version) ?? String(version)}.`);
	}
	if (version > current) {
		throw new LayerMigrationError(`This layer was written by a newer Meniscus (version ${version}); this server reads up to version ${current}.`);
	}
	let layer = copy(raw);
	for (let v = version; v < current; v++) {
		const step = byFrom.get(v);
		if (!step) throw new LayerMigrationError(`This layer is version ${version}, and Meniscus has no way to bring a version ${v} layer up to version ${v + 1}.`);
		let next: unknown;
		try {
			next = step.up(layer);
		} catch (cause) {
			throw new LayerMigrationError(`Bringing this layer from version ${v} to ${v + 1} failed: ${cause instanceof Error ? cause.message : String(cause)}`, { cause });
		}
		if (!isRecord(next)) throw new LayerMigrationError(`The migration from version ${v} to ${v + 1} did not return a layer.`);
		layer = { ...next, schemaVersion: v + 1 };
	}
	return layer;
}

/** One readable line per schema finding, with where it is: "marks.2.points: An outline needs at least 3 points." */
function describe(issues: readonly z.core.$ZodIssue[]): string {
	const lines = issues.slice(0, 3).map((i) => (i.path.length > 0 ? `${i.path.map(String).join('.')}: ${i.message}` : i.message));
	const more = issues.length > 3 ? ` (and ${issues.length - 3} more)` : '';
	return lines.join(' ') + more;
}

/** migrateLayer with its registry passed in (for tests). */
export function migrateLayerWith(raw: unknown, steps: readonly MigrationStep[]): MarkLayer {
	const layer = migrateRaw(raw, steps, MARK_SCHEMA_VERSION);
	const parsed = MarkLayerSchema.safeParse(layer);
	if (!parsed.success) throw new LayerMigrationError(`This mark layer is not valid. ${describe(parsed.error.issues)}`, { cause: parsed.error, issues: parsed.error.issues });
	return parsed.data;
}

/**
 * A stored layer, of any version this build knows, as a valid current MarkLayer. Throws a
 * LayerMigrationError, with a message fit to show, when the layer is newer than this build, has
 * no version, or is not valid once brought forward.
 */
export function migrateLayer(raw: unknown): MarkLayer {
	return migrateLayerWith(raw, MIGRATIONS);
}
