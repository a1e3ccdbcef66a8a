import path from 'node:path';

/**
 * Orphans between the photo records and the uploads folder (TESTPLAN D6, "0 orphans"): a record
 * whose master or derivative file is missing, or a file under masters/ or derivatives/ that no
 * record names. A tile pyramid is recorded by its info.json and owns the folder around it.
 * incoming/, quarantine/ and work/ hold uploads on their way in (photo_uploads rows, the
 * reconciler's business), not photos, so they are not looked at here.
 */
export interface PhotoRow {
	id: string;
	masterPath: string;
	derivativeSet: string;
}

export interface DerivativeRow {
	photoId: string;
	setId: string;
	kind: string;
	path: string;
}

export interface Orphans {
	/** Files a record names that are not there. */
	missing: string[];
	/** Photo files no record names. */
	unowned: string[];
}

const PHOTO_AREAS = ['masters/', 'derivatives/'];

/** `files`: every file below the uploads folder, relative and '/'-separated. */
export function findOrphans(photos: PhotoRow[], derivatives: DerivativeRow[], files: string[]): Orphans {
	const present = new Set(files);
	const current = new Map(photos.map((p) => [p.id, p.derivativeSet]));
	const owned = new Set<string>();
	const ownedFolders: string[] = [];
	const missing: string[] = [];
	for (const p of photos) {
		owned.add(p.masterPath);
		if (!present.has(p.masterPath)) missing.push(p.masterPath);
	}
	for (const d of derivatives) {
		// Only the photo's current set counts: rows of another set would themselves be a fault.
		if (current.get(d.photoId) !== d.setId) {
			missing.push(`${d.path} (set ${d.setId} is not the photo's current set)`);
			continue;
		}
		owned.add(d.path);
		if (d.kind === 'tiles') ownedFolders.push(`${path.posix.dirname(d.path)}/`);
		if (!present.has(d.path)) missing.push(d.path);
	}
	const unowned = files.filter(
		(f) => PHOTO_AREAS.some((a) => f.startsWith(a)) && !owned.has(f) && !ownedFolders.some((folder) => f.startsWith(folder)),
	);
	return { missing, unowned };
}
