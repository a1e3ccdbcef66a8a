import fsp from 'node:fs/promises';
import path from 'node:path';
import pg from 'pg';
import { listFiles } from '../../scripts/lib/backup/files.ts';
import { sha256File } from '../../src/lib/server/photos/storage.ts';
import { findOrphans, type DerivativeRow, type PhotoRow } from './orphans.ts';

/**
 * What the database says is stored, checked against the uploads folder (TESTPLAN F5 and F7):
 * every photo row's master is there with the recorded byte size and SHA-256, every derivative row's
 * file is there with its recorded size, no photo file lies around that no row names, and every
 * upload marked recorded has its photo (nothing marked complete that is not). Problems come back as
 * sentences, so a failure names the file.
 */
export interface StoredPhotos {
	photos: number;
	derivatives: number;
	problems: string[];
}

async function sizeOf(file: string): Promise<number | null> {
	return fsp.stat(file).then((s) => s.size, () => null);
}

export async function checkStoredPhotos(databaseUrl: string, uploadsDir: string): Promise<StoredPhotos> {
	const client = new pg.Client({ connectionString: databaseUrl });
	await client.connect();
	try {
		const photos = (await client.query<PhotoRow & { byteSize: string; sha256: string }>(`SELECT id, master_path AS "masterPath", derivative_set AS "derivativeSet", byte_size AS "byteSize", sha256 FROM photos`)).rows;
		const derivatives = (await client.query<DerivativeRow & { byteSize: string }>(`SELECT photo_id AS "photoId", set_id AS "setId", kind, path, byte_size AS "byteSize" FROM photo_derivatives`)).rows;
		const unbacked = (await client.query<{ id: string }>(`SELECT u.id FROM photo_uploads u LEFT JOIN photos p ON p.id = u.photo_id WHERE u.state = 'recorded' AND p.id IS NULL`)).rows;
		const problems: string[] = [];
		for (const p of photos) {
			const file = path.join(uploadsDir, p.masterPath);
			const size = await sizeOf(file);
			if (size === null) problems.push(`master ${p.masterPath} of photo ${p.id} is missing`);
			else if (size !== Number(p.byteSize)) problems.push(`master ${p.masterPath} has ${size} bytes, the row says ${p.byteSize}`);
			else if ((await sha256File(file)) !== p.sha256) problems.push(`master ${p.masterPath} does not match its recorded SHA-256`);
		}
		for (const d of derivatives) {
			const size = await sizeOf(path.join(uploadsDir, d.path));
			if (size !== null && size !== Number(d.byteSize)) problems.push(`derivative ${d.path} has ${size} bytes, the row says ${d.byteSize}`);
		}
		const orphans = findOrphans(photos, derivatives, await listFiles(uploadsDir));
		problems.push(...orphans.missing.map((f) => `${f} is recorded but missing`), ...orphans.unowned.map((f) => `${f} is a photo file no row names`));
		problems.push(...unbacked.map((u) => `upload ${u.id} is marked recorded without its photo`));
		return { photos: photos.length, derivatives: derivatives.length, problems };
	} finally {
		await client.end();
	}
}
