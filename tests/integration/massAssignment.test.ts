import { beforeAll, describe, expect, it } from 'vitest';
import { call, useTestDatabase } from '../helpers/server.ts';
import { gradedCheck } from '../helpers/checks.ts';
import { tusMetadata } from '../helpers/photos.ts';
import { buildWorld, worldRows, type World } from '../helpers/world.ts';
import { validWrites, type ValidWrite } from '../helpers/validWrites.ts';
import { PhotoUpload } from '../../src/lib/server/models/index.ts';

/**
 * TESTPLAN A3 (ASVS 5.0 8.2.3 field-level access, 15.3.3 no mass assignment): a body that also
 * names the fields the server owns (state, author, owner, version, creation time, id, role) is
 * refused whole, on every route that writes a record, and nothing of it is applied. Each case is a
 * body the route would otherwise accept, so the refusal is the extra field's doing.
 */
const json = async (path: string, cookie: string) => (await call(path, { cookie })).json();
let w: World;
let CASES: ValidWrite[];

beforeAll(async () => {
	useTestDatabase();
	w = await buildWorld('mass');
	CASES = validWrites(w);
});

/** Fields a client must never set. Each is tried on its own, at the top and inside the record. */
const OWNED = (w: World) => ({
	status: 'approved',
	state: 'approved',
	authorId: w.b.id,
	ownerId: w.b.id,
	examinerId: w.b.id,
	reviewerId: w.reviewer.id,
	uploaderId: w.b.id,
	createdBy: w.b.id,
	version: 99,
	createdAt: '2000-01-01T00:00:00.000Z',
	id: '00000000-0000-4000-8000-000000000001',
	role: 'admin',
});

describe('fields the server owns, sent in a body', () => {
	it('are refused whole on every record write, and nothing is applied', async () => {
		for (const c of CASES) await refusedWhole(c);
	});

	async function refusedWhole(c: ValidWrite): Promise<void> {
		const rows = await worldRows(w);
		for (const [field, value] of Object.entries(OWNED(w))) {
			const body = await c.body();
			// `version` at the top of a save is the route's own field (the version the edit began from; a wrong one is a 409).
			const top = field in body ? [] : [{ ...body, [field]: value }];
			for (const sent of [...top, ...(c.inner ? [{ ...body, [c.inner]: { ...(body[c.inner] as object), [field]: value } }] : [])]) {
				const res = await call(c.path, { method: c.method, cookie: c.who.cookie, json: sent });
				const answer = await res.json();
				expect(res.status, `${c.name}: ${field}: ${JSON.stringify(answer)}`).toBe(400);
				// Named in the answer, so the person knows which field the server will not take.
				expect(JSON.stringify(answer.fields), `${c.name}: ${field}`).toContain(field);
			}
		}
		expect(await worldRows(w), c.name).toEqual(rows);
	}

	it('accepts the same bodies without those fields, so each refusal above was the field’s doing', async () => {
		// Submitting and approving close the check to the other saves, so they go last.
		const last = ['submitting a check', 'reviewing a check'];
		for (const c of [...CASES.filter((x) => !last.includes(x.name)), ...last.map((n) => CASES.find((x) => x.name === n)!)]) {
			const res = await call(c.path, { method: c.method, cookie: c.who.cookie, json: await c.body() });
			expect(res.status, `${c.name}: ${await res.clone().text()}`).toBeLessThan(300);
		}
	});

	it('takes the uploader from the session, not from the upload’s metadata', async () => {
		const meta = tusMetadata({ filename: 'forged.jpg', filetype: 'image/jpeg', specimenId: w.specimenId, view: 'front', stage: 'as-found', uploaderId: w.a.id });
		const res = await call('/api/uploads/', { method: 'POST', cookie: w.b.cookie, headers: { 'tus-resumable': '1.0.0', 'upload-length': '100', 'upload-metadata': meta } });
		expect(res.status).toBe(201);
		const id = res.headers.get('location')!.split('/').pop()!;
		expect((await PhotoUpload.findByPk(id))?.uploaderId).toBe(w.b.id);
		// A is not made the owner: the upload is not among A's.
		expect((await json(`/api/uploads/status?id=${id}`, w.a.cookie)).uploads).toEqual([]);
	});

	it('lets a reviewer change neither a check nor its state through the conservator’s routes', async () => {
		const rows = await worldRows(w);
		const { check } = await json(`/api/checks/${w.checkId}`, w.a.cookie);
		expect((await call(`/api/checks/${w.checkId}`, { method: 'PUT', cookie: w.reviewer.cookie, json: { version: check.version, check: gradedCheck() } })).status).toBe(403);
		expect((await call(`/api/checks/${w.checkId}/submit`, { cookie: w.reviewer.cookie, json: { version: check.version } })).status).toBe(403);
		expect(await worldRows(w)).toEqual(rows);
	});
});
