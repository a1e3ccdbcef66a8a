import fs from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import type tus from 'tus-js-client';
import { call, useTestDatabase } from '../helpers/server.ts';
import { signedInUser } from '../helpers/users.ts';
import { makeSpecimen, sampleJpeg, settled, sha256, sha256OfFile, tusStart, tusUpload, uploadIdOf, uploadPhoto } from '../helpers/photos.ts';
import { db } from '../../src/lib/server/db.ts';
import { Photo } from '../../src/lib/server/models/index.ts';
import { resolveStored } from '../../src/lib/server/photos/storage.ts';
import { EXPIRE_AFTER_DAYS } from '../../src/lib/server/photos/reconcile.ts';

/**
 * TESTPLAN F9, upload expiry (tus 1.0.0: an expired upload answers 404 or 410 and the client starts
 * a new one; @tus/server's cleanup must spare finished files): an upload left part way is made to
 * look untouched for longer than the expiry (its record back-dated), and the worker's reconciler
 * expires it. Pass: the record says why; HEAD and PATCH on its URL answer 404/410; its bytes are
 * gone; a fresh upload of the same file is recorded; a photo recorded earlier keeps its master.
 */
let cookie = '';
let specimenId = '';

beforeAll(async () => {
	useTestDatabase();
	({ cookie } = await signedInUser('conservator', 'expiry'));
	specimenId = await makeSpecimen(cookie, 'EXP');
});

async function waitFor<T>(what: string, probe: () => Promise<T | null>, ms = 60_000): Promise<T> {
	const until = Date.now() + ms;
	while (Date.now() < until) {
		const v = await probe();
		if (v !== null) return v;
		await new Promise((r) => setTimeout(r, 250));
	}
	throw new Error(`${what} did not happen within ${ms} ms`);
}

describe('an upload left part way (TESTPLAN F9)', () => {
	it('expires after the expiry period, answers 404/410, and spares finished photos', async () => {
		const keptId = await uploadPhoto(cookie, specimenId, 'kept.jpg');
		const kept = (await Photo.findByPk(keptId))!;
		const bytes = await sampleJpeg(2400, 1800);
		const meta = { filename: 'left.jpg', filetype: 'image/jpeg', specimenId, view: 'front', stage: 'as-found' };
		// Send the first chunk, then stop, as a closed laptop would.
		let client: tus.Upload | undefined;
		const chunk = Math.ceil(bytes.length / 3);
		const stopped = new Promise<string>((resolve) => {
			tusStart(bytes, { cookie, meta, chunkSize: chunk, started: (u) => (client = u), onChunkComplete: () => { void client!.abort(); resolve(client!.url!); } });
		});
		const url = await stopped;
		const id = uploadIdOf(url);
		expect((await call(new URL(url).pathname, { method: 'HEAD', cookie, headers: { 'tus-resumable': '1.0.0' } })).headers.get('upload-offset')).toBe(String(chunk));
		// Nobody has touched it for longer than the expiry period.
		await db().query(`UPDATE photo_uploads SET updated_at = now() - make_interval(days => :days) WHERE id = :id`, { replacements: { id, days: EXPIRE_AFTER_DAYS + 1 }, type: QueryTypes.UPDATE });
		const row = await waitFor('expiry', async () => {
			const [r] = await db().query<{ state: string; refusal_code: string | null; reason: string | null }>(`SELECT state, refusal_code, reason FROM photo_uploads WHERE id = :id`, { replacements: { id }, type: QueryTypes.SELECT });
			return r && r.state === 'refused' ? r : null;
		});
		expect(row.refusal_code).toBe('expired');
		expect(row.reason).toMatch(new RegExp(`stopped at ${chunk} of ${bytes.length} bytes and was not resumed within ${EXPIRE_AFTER_DAYS} days`));
		const head = await call(new URL(url).pathname, { method: 'HEAD', cookie, headers: { 'tus-resumable': '1.0.0' } });
		expect([404, 410]).toContain(head.status);
		const patch = await call(new URL(url).pathname, { method: 'PATCH', cookie, headers: { 'tus-resumable': '1.0.0', 'upload-offset': String(chunk), 'content-type': 'application/offset+octet-stream' } });
		expect([404, 410]).toContain(patch.status);
		// The client starts again from nothing and the photo is recorded.
		const fresh = await tusUpload(bytes, { cookie, meta });
		const done = await settled(cookie, fresh.id);
		expect(done.state).toBe('recorded');
		expect((await Photo.findByPk(done.photoId!))!.sha256).toBe(sha256(bytes));
		// The cleanup spared what was finished before.
		const master = resolveStored(kept.masterPath);
		expect(fs.existsSync(master)).toBe(true);
		expect(await sha256OfFile(master)).toBe(kept.sha256);
	}, 120_000);
});
