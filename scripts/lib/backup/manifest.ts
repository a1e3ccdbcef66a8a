import { z } from 'zod';

/**
 * What a backup folder holds, as written in its manifest.json. Pure: no I/O, so the rules are tested
 * on their own (tests/unit/backupManifest.test.ts). The manifest is written last, so a folder without
 * one is a backup that never finished and restore refuses it.
 */
export const MANIFEST_NAME = 'manifest.json';
export const DUMP_NAME = 'database.dump';
/** The uploads folder's copy inside a backup; manifest paths of uploaded files start with it. */
export const UPLOADS_PREFIX = 'uploads/';
export const FORMAT = 'meniscus-backup';

/** A path inside the backup folder: relative, '/'-separated, never climbing out of it. */
const InsidePath = z
	.string()
	.min(1)
	.refine((p) => !p.startsWith('/') && !p.includes('\\') && !p.split('/').some((s) => s === '..' || s === '.' || s === ''), {
		message: 'must be a relative path inside the backup folder',
	});

export const FileEntrySchema = z.object({
	path: InsidePath,
	size: z.number().int().nonnegative(),
	sha256: z.string().regex(/^[0-9a-f]{64}$/, 'must be 64 lowercase hex digits'),
});
export type FileEntry = z.infer<typeof FileEntrySchema>;

/** A table's row count and a digest of its contents, both read in the snapshot pg_dump wrote. */
export const TableEntrySchema = z.object({
	rows: z.number().int().nonnegative(),
	md5: z.string().regex(/^[0-9a-f]{32}$/, 'must be 32 lowercase hex digits'),
});
export type TableEntry = z.infer<typeof TableEntrySchema>;
export type TableDigests = Record<string, TableEntry>;

/** A file that was listed but gone before it could be copied (see copyTree); kept so nobody wonders. */
const SkippedSchema = z.object({ path: InsidePath, reason: z.string().min(1) });

export const ManifestSchema = z.object({
	format: z.literal(FORMAT),
	version: z.literal(1),
	startedAt: z.iso.datetime(),
	finishedAt: z.iso.datetime(),
	app: z.object({ name: z.string().min(1), version: z.string().min(1) }),
	postgres: z.object({ server: z.string().min(1), pgDump: z.string().min(1) }),
	database: z.object({ name: z.string().min(1), dump: z.literal(DUMP_NAME), tables: z.record(z.string(), TableEntrySchema) }),
	uploads: z.object({ source: z.string().min(1), skipped: z.array(SkippedSchema) }),
	files: z.array(FileEntrySchema),
});
export type Manifest = z.infer<typeof ManifestSchema>;

export class ManifestError extends Error {
	override name = 'ManifestError';
}

const byPath = (a: { path: string }, b: { path: string }) => (a.path < b.path ? -1 : a.path > b.path ? 1 : 0);

/**
 * The manifest of a finished backup, in a stable order (files by path, tables by name) so two
 * backups of the same data differ only in their times. Refuses what it could not restore later.
 */
export function buildManifest(input: Manifest): Manifest {
	const files = [...input.files].sort(byPath);
	for (let i = 1; i < files.length; i++) {
		if (files[i]!.path === files[i - 1]!.path) throw new ManifestError(`${files[i]!.path} is listed twice`);
	}
	if (!files.some((f) => f.path === DUMP_NAME)) throw new ManifestError(`the database dump ${DUMP_NAME} is not listed`);
	const tables = Object.fromEntries(Object.entries(input.database.tables).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)));
	return ManifestSchema.parse({ ...input, files, database: { ...input.database, tables }, uploads: { ...input.uploads, skipped: [...input.uploads.skipped].sort(byPath) } });
}

/** Reads manifest.json's text; every problem is a ManifestError saying what is wrong where. */
export function parseManifest(text: string): Manifest {
	let json: unknown;
	try {
		json = JSON.parse(text);
	} catch (err) {
		throw new ManifestError(`${MANIFEST_NAME} is not valid JSON (${(err as Error).message})`);
	}
	const parsed = ManifestSchema.safeParse(json);
	if (!parsed.success) {
		const lines = parsed.error.issues.slice(0, 10).map((i) => `${i.path.join('.') || '(top)'}: ${i.message}`);
		throw new ManifestError(`${MANIFEST_NAME} is not a Meniscus backup manifest:\n  ${lines.join('\n  ')}`);
	}
	return parsed.data;
}

/** The uploaded files of a manifest, with paths relative to the uploads folder. */
export function uploadEntries(manifest: Manifest): FileEntry[] {
	return manifest.files.filter((f) => f.path.startsWith(UPLOADS_PREFIX)).map((f) => ({ ...f, path: f.path.slice(UPLOADS_PREFIX.length) }));
}

/** A backup's folder name: sortable, no ':' (which some file systems and tools refuse). */
export function backupFolderName(at: Date): string {
	return `meniscus-${at.toISOString().replace(/[-:]/g, '').replace(/\.\d{3}Z$/, 'Z')}`;
}
