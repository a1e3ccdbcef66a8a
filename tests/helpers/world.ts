import { QueryTypes } from 'sequelize';
import { expect } from 'vitest';
import { call } from './server.ts';
import { makeUser, signedInUser } from './users.ts';
import { newSpecimen } from './checks.ts';
import { openCheck, sampleJpeg, settled, tusMetadata, tusUpload } from './photos.ts';
import { openTreatment } from './treatments.ts';
import { db } from '../../src/lib/server/db.ts';
import type { MarkLayer } from '../../src/lib/marks/schema.ts';

/**
 * One conservator's own records, made over HTTP the way the app makes them, for the hostile-input
 * and access tests: a specimen, a draft check with a marked photo, a photo of the specimen, a saved
 * comparison of the two, an upload left unfinished, a treatment just opened, plus the other people
 * who poke at them (a second conservator, a reviewer, a curator, an administrator) and the
 * administrator's own targets (a user, a storage location, a treatment material). Nothing here
 * touches the demo collection.
 */
export interface Person {
	id: string;
	cookie: string;
}

export interface World {
	a: Person;
	b: Person;
	reviewer: Person;
	curator: Person;
	admin: Person;
	specimenId: string;
	objectNumber: string;
	checkId: string;
	/** In the draft check, with A's marks. */
	photoId: string;
	/** Of the specimen, outside any check. */
	specimenPhotoId: string;
	comparisonId: string;
	/** Path of a tus upload A created and never finished. */
	uploadPath: string;
	/** A's treatment of the specimen, just opened. */
	treatmentId: string;
	/** A user, a location and a treatment material only the administrator's requests aim at. */
	targetUserId: string;
	locationId: string;
	materialId: string;
}

const t = '2026-12-02T09:00:00.000Z';

export const worldLayer = (authorId: string): MarkLayer => ({
	schemaVersion: 1,
	marks: [
		{ id: 'crack', kind: 'path', part: 'seal', term: 'cracked', severity: 2, note: 'Rim, left.', points: [[40, 40], [120, 60]], authorId, createdAt: t, updatedAt: t },
		{ id: 'scale', kind: 'scale', from: [20, 380], to: [320, 380], lengthMm: 50, authorId, createdAt: t, updatedAt: t },
	],
	comments: [],
});

async function photo(cookie: string, specimenId: string, name: string, checkId?: string): Promise<string> {
	const meta: Record<string, string> = { filename: name, filetype: 'image/jpeg', specimenId, view: 'front', stage: 'as-found', ...(checkId ? { checkId } : {}) };
	const { id } = await tusUpload(await sampleJpeg(600, 400), { cookie, meta });
	const done = await settled(cookie, id);
	if (!done.photoId) throw new Error(`upload ${name}: ${done.state} ${done.reason}`);
	return done.photoId;
}

export async function buildWorld(tag: string): Promise<World> {
	const [a, b, reviewer, curator, admin] = await Promise.all([
		signedInUser('conservator', `${tag}-a`),
		signedInUser('conservator', `${tag}-b`),
		signedInUser('reviewer', `${tag}-r`),
		signedInUser('curator', `${tag}-k`),
		signedInUser('admin', `${tag}-adm`),
	]);
	const specimen = await newSpecimen(a.cookie, `${tag.toUpperCase()}.${process.pid}`);
	const check = await openCheck(a.cookie, specimen.id);
	const [photoId, specimenPhotoId] = await Promise.all([photo(a.cookie, specimen.id, 'in-check.jpg', check.id), photo(a.cookie, specimen.id, 'of-specimen.jpg')]);
	const marked = await call(`/api/photos/${photoId}/marks`, { method: 'PUT', cookie: a.cookie, json: { version: 0, layer: worldLayer(a.id) } });
	expect(marked.status, await marked.clone().text()).toBe(200);
	const compared = await call(`/api/specimens/${specimen.id}/comparisons`, {
		cookie: a.cookie,
		json: { beforePhotoId: photoId, afterPhotoId: specimenPhotoId, model: 'none', controlPoints: [], note: '' },
	});
	expect(compared.status, await compared.clone().text()).toBe(201);
	const upload = await call('/api/uploads/', {
		method: 'POST',
		cookie: a.cookie,
		headers: { 'tus-resumable': '1.0.0', 'upload-length': '1000', 'upload-metadata': tusMetadata({ filename: 'unfinished.jpg', filetype: 'image/jpeg', specimenId: specimen.id, view: 'front', stage: 'as-found' }) },
	});
	expect(upload.status).toBe(201);
	const location = await call('/api/locations', { cookie: admin.cookie, json: { code: `${tag.toUpperCase()}-${process.pid}`, name: `Test store ${tag}` } });
	expect(location.status).toBe(201);
	const material = await call('/api/treatment-materials', { cookie: admin.cookie, json: { kind: 'thread', name: `Test thread ${tag} ${process.pid}` } });
	expect(material.status).toBe(201);
	return {
		a,
		b,
		reviewer,
		curator,
		admin,
		specimenId: specimen.id,
		objectNumber: specimen.objectNumber,
		checkId: check.id,
		photoId,
		specimenPhotoId,
		comparisonId: (await compared.json()).comparison.id,
		uploadPath: upload.headers.get('location')!,
		treatmentId: (await openTreatment(a.cookie, specimen.id)).id,
		targetUserId: (await makeUser('conservator', { tag: `${tag}-target` })).user.id,
		locationId: (await location.json()).location.id,
		materialId: (await material.json()).material.id,
	};
}

/**
 * The stored state of the world's records, as the database holds it: whatever a refused request
 * did, this must read the same afterwards. Each row as JSON text, so any column that changed shows.
 */
export async function worldRows(w: World): Promise<Record<string, unknown>> {
	const q = (sql: string, id: string) => db().query<{ row: string }>(sql, { replacements: { id }, type: QueryTypes.SELECT }).then((r) => r.map((x) => x.row));
	const [specimen, checks, layers, comparison, upload, treatments, user, location, material] = await Promise.all([
		q(`SELECT row_to_json(s)::text AS row FROM specimens s WHERE id = :id`, w.specimenId),
		q(`SELECT row_to_json(c)::text AS row FROM condition_checks c WHERE specimen_id = :id ORDER BY id`, w.specimenId),
		q(`SELECT row_to_json(l)::text AS row FROM mark_layers l WHERE photo_id IN (SELECT id FROM photos WHERE specimen_id = :id) ORDER BY photo_id`, w.specimenId),
		q(`SELECT row_to_json(c)::text AS row FROM photo_comparisons c WHERE specimen_id = :id ORDER BY id`, w.specimenId),
		q(`SELECT row_to_json(u)::text AS row FROM photo_uploads u WHERE specimen_id = :id ORDER BY id`, w.specimenId),
		q(`SELECT row_to_json(t)::text AS row FROM treatments t WHERE specimen_id = :id ORDER BY id`, w.specimenId),
		q(`SELECT row_to_json(u)::text AS row FROM users u WHERE id = :id`, w.targetUserId),
		q(`SELECT row_to_json(l)::text AS row FROM storage_locations l WHERE id = :id`, w.locationId),
		q(`SELECT row_to_json(m)::text AS row FROM treatment_materials m WHERE id = :id`, w.materialId),
	]);
	return { specimen, checks, layers, comparison, upload, treatments, user, location, material };
}

/** How many audit events the world's people have caused: every stored change is audited with its actor. */
export async function auditCount(w: World): Promise<number> {
	const ids = [w.a.id, w.b.id, w.reviewer.id, w.curator.id, w.admin.id];
	const [row] = await db().query<{ n: number }>(`SELECT count(*)::int AS n FROM audit_events WHERE actor_id IN (:ids) AND action NOT IN (:reads)`, {
		replacements: { ids, reads: READ_AUDITS },
		type: QueryTypes.SELECT,
	});
	return row!.n;
}

/** Audit events that record a read or a refusal, not a change. */
const READ_AUDITS = ['check.report-downloaded', 'photo.original-downloaded', 'access.refused', 'request.cross-site-refused'];
