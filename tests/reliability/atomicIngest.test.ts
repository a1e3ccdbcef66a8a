import fs from 'node:fs';
import path from 'node:path';
import { afterEach, beforeAll, describe, expect, inject, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { useTestDatabase } from '../helpers/server.ts';
import { signedInUser } from '../helpers/users.ts';
import { makeSpecimen, sampleJpeg, settled, sha256, tusUpload } from '../helpers/photos.ts';
import { db } from '../../src/lib/server/db.ts';
import { Photo, PhotoDerivative, PhotoUpload } from '../../src/lib/server/models/index.ts';
import { photoIdFor } from '../../src/lib/server/photos/ingest.ts';

/**
 * TESTPLAN D3, atomic writes (ASVS 5.0 2.3.3): a photograph's record is its photo row, its
 * derivative rows, its first fixity check, the upload's new state and the audit event, written in
 * one transaction after the files are in place. Here the database itself throws in the middle of
 * that transaction (a trigger made for one file name), once after the photo row and once at the
 * very last row, the audit event. Pass: while the fault stands nothing of the record exists; once
 * it is lifted the worker's retry records the photograph whole, exactly once, with only its
 * current derivative set left on disk and its master's hash that of the bytes sent.
 */
let cookie = '';
let specimenId = '';

beforeAll(async () => {
	useTestDatabase();
	db();
	({ cookie } = await signedInUser('conservator', 'atomic'));
	specimenId = await makeSpecimen(cookie, 'ATM');
});

const FAULTS = {
	// After the photo row, at its first derivative row.
	derivatives: (name: string) => ({
		table: 'photo_derivatives',
		condition: `EXISTS (SELECT 1 FROM photos p WHERE p.id = NEW.photo_id AND p.file_name = '${name}')`,
	}),
	// At the last row of the transaction.
	audit: (name: string) => ({
		table: 'audit_events',
		condition: `NEW.action = 'photo.recorded' AND NEW.after->>'fileName' = '${name}'`,
	}),
} as const;

let dropFault: (() => Promise<void>) | null = null;
afterEach(async () => {
	await dropFault?.();
	dropFault = null;
});

async function injectFault(point: keyof typeof FAULTS, name: string): Promise<void> {
	const { table, condition } = FAULTS[point](name);
	const fn = `d3_fault_${point}_${process.pid}`;
	await db().query(
		`CREATE FUNCTION ${fn}() RETURNS trigger AS $$
		 BEGIN
		   IF ${condition} THEN RAISE EXCEPTION 'injected fault (TESTPLAN D3) at %', TG_TABLE_NAME; END IF;
		   RETURN NEW;
		 END $$ LANGUAGE plpgsql;
		 CREATE TRIGGER ${fn} BEFORE INSERT ON ${table} FOR EACH ROW EXECUTE FUNCTION ${fn}();`,
	);
	dropFault = async () => {
		await db().query(`DROP TRIGGER IF EXISTS ${fn} ON ${table}; DROP FUNCTION IF EXISTS ${fn}();`);
	};
}

/** Waits until the ingest job of this upload has failed at least once (pg-boss counts retries). */
async function failedOnce(uploadId: string, ms = 60_000): Promise<void> {
	const until = Date.now() + ms;
	while (Date.now() < until) {
		const [job] = await db().query<{ retry_count: number; state: string }>(
			`SELECT retry_count, state FROM pgboss.job WHERE name = 'photo-ingest' AND data->>'uploadId' = :uploadId ORDER BY created_on DESC LIMIT 1`,
			{ replacements: { uploadId }, type: QueryTypes.SELECT },
		);
		if (job && (job.retry_count >= 1 || job.state === 'failed')) return;
		await new Promise((r) => setTimeout(r, 200));
	}
	throw new Error(`the ingest job of ${uploadId} did not fail within ${ms} ms`);
}

async function recordOf(uploadId: string) {
	const photoId = photoIdFor(uploadId);
	const count = async (sql: string) =>
		Number((await db().query<{ n: string }>(sql, { replacements: { photoId, uploadId }, type: QueryTypes.SELECT }))[0]!.n);
	return {
		photoId,
		photos: await Photo.count({ where: { uploadId } }),
		derivatives: await PhotoDerivative.count({ where: { photoId } }),
		fixity: await count(`SELECT count(*) AS n FROM photo_fixity_checks WHERE photo_id = :photoId`),
		recordedEvents: await count(`SELECT count(*) AS n FROM audit_events WHERE action = 'photo.recorded' AND entity_id = :photoId`),
		uploadState: (await PhotoUpload.findByPk(uploadId))!.state,
	};
}

describe('a fault inside the transaction that records a photograph (TESTPLAN D3)', () => {
	it.each(Object.keys(FAULTS) as (keyof typeof FAULTS)[])('leaves nothing of the record at a fault at the %s rows, and the retry records it whole', async (point) => {
		const name = `d3-${point}-${process.pid}.jpg`;
		await injectFault(point, name);
		const bytes = await sampleJpeg(900, 600);
		const { id } = await tusUpload(bytes, { cookie, meta: { filename: name, filetype: 'image/jpeg', specimenId, view: 'front', stage: 'as-found' } });
		await failedOnce(id);
		expect(await recordOf(id)).toMatchObject({ photos: 0, derivatives: 0, fixity: 0, recordedEvents: 0, uploadState: expect.not.stringMatching(/^recorded$/) });

		await dropFault!();
		dropFault = null;
		const done = await settled(cookie, id, 120_000);
		expect(done.state).toBe('recorded');
		const after = await recordOf(id);
		expect(after).toMatchObject({ photos: 1, fixity: 1, recordedEvents: 1, uploadState: 'recorded' });
		const photo = (await Photo.findByPk(after.photoId))!;
		const rows = await PhotoDerivative.findAll({ where: { photoId: photo.id } });
		expect(rows.length).toBe(after.derivatives);
		expect(new Set(rows.map((r) => r.setId))).toEqual(new Set([photo.derivativeSet]));
		// The failed attempts' sets are gone from disk (removed just after the commit that recorded the
		// photo, so give it a moment); the master holds the bytes sent.
		const root = inject('uploadsDir');
		await expect.poll(() => fs.readdirSync(path.join(root, 'derivatives', photo.id)), { timeout: 15_000 }).toEqual([photo.derivativeSet]);
		expect(photo.sha256).toBe(sha256(bytes));
		expect(sha256(fs.readFileSync(path.join(root, photo.masterPath)))).toBe(photo.sha256);
	}, 180_000);
});
