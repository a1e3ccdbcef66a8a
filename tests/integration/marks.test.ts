import fc from 'fast-check';
import { QueryTypes } from 'sequelize';
import { beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, call, signIn, useTestDatabase } from '../helpers/server.ts';
import { cookieFor, makeUser } from '../helpers/users.ts';
import { makeSpecimen, openCheck, sampleJpeg, settled, tusUpload } from '../helpers/photos.ts';
import { db } from '../../src/lib/server/db.ts';
import type { MarkLayer } from '../../src/lib/marks/schema.ts';

/**
 * A photo's mark layer through the API: saved whole and read back, optimistic locking (a stale
 * save changes nothing and gets the current layer), validation and limits, who may edit or only
 * comment, approved checks frozen, and no 500 whatever JSON arrives.
 */
let conservator: string;
let conservatorId: string;
let reviewer: string;
let reviewerId: string;
let curator: string;
let photoId: string;

beforeAll(async () => {
	useTestDatabase();
	const c = await makeUser('conservator', { tag: 'marks-c' });
	conservatorId = c.user.id;
	conservator = await cookieFor(conservatorId);
	const r = await makeUser('reviewer', { tag: 'marks-r' });
	reviewerId = r.user.id;
	reviewer = await cookieFor(reviewerId);
	curator = await cookieFor((await makeUser('curator', { tag: 'marks-k' })).user.id);
	const specimenId = await makeSpecimen(conservator, 'MRK');
	const check = await openCheck(conservator, specimenId);
	const { id } = await tusUpload(await sampleJpeg(1200, 900), { cookie: conservator, meta: { filename: 'marks.jpg', filetype: 'image/jpeg', specimenId, checkId: check.id, view: 'front', stage: 'as-found' } });
	photoId = (await settled(conservator, id)).photoId!;
});

const t = '2026-12-02T10:00:00.000Z';
const layerOf = (authorId: string, extra: Partial<MarkLayer> = {}): MarkLayer => ({
	schemaVersion: 1,
	marks: [
		{ id: 'seal-crack', kind: 'path', part: 'seal', term: 'cracked', severity: 2, note: 'Crack along the rim, left.', points: [[100, 100], [180, 120], [260, 118]], authorId, createdAt: t, updatedAt: t },
		{ id: 'loss', kind: 'outline', part: 'specimen', term: 'tissue loss', severity: 3, note: '', points: [[400, 400], [520, 400], [520, 520], [400, 520]], authorId, createdAt: t, updatedAt: t },
		{ id: 'thread', kind: 'pin', part: 'mount', term: 'snapped thread', severity: 2, note: 'Thread gone at the top.', at: [600, 90], authorId, createdAt: t, updatedAt: t },
		{ id: 'scale', kind: 'scale', from: [50, 850], to: [650, 850], lengthMm: 100, authorId, createdAt: t, updatedAt: t },
		{ id: 'fluid', kind: 'level', level: 'fluid-line', from: [300, 200], to: [900, 200], authorId, createdAt: t, updatedAt: t },
	],
	comments: [],
	...extra,
});

const get = async (cookie: string) => (await call(`/api/photos/${photoId}/marks`, { cookie })).json();
const put = (cookie: string, version: number, layer: unknown) => call(`/api/photos/${photoId}/marks`, { method: 'PUT', cookie, json: { version, layer } });

describe('a mark layer', () => {
	it('starts empty and says who may do what', async () => {
		expect(await get(conservator)).toMatchObject({ version: 0, mode: 'edit', layer: { schemaVersion: 1, marks: [], comments: [] }, photo: { width: 1200, height: 900 } });
		expect((await get(reviewer)).mode).toBe('comment');
		expect((await get(curator)).mode).toBe('read');
	});

	it('is saved whole and read back exactly', async () => {
		const res = await put(conservator, 0, layerOf(conservatorId));
		expect(res.status, await res.clone().text()).toBe(200);
		expect((await res.json()).version).toBe(1);
		const back = await get(curator);
		expect(back.version).toBe(1);
		expect(back.layer).toEqual(layerOf(conservatorId));
	});

	it('refuses a stale save, changes nothing, and returns the layer as it is now', async () => {
		const before = await get(conservator);
		const res = await put(conservator, 0, layerOf(conservatorId, { marks: [] }));
		expect(res.status).toBe(409);
		const body = await res.json();
		expect(body.current.version).toBe(before.version);
		expect(body.current.layer).toEqual(before.layer);
		expect((await get(conservator)).layer).toEqual(before.layer);
	});

	it('lets exactly one of 20 simultaneous editors commit each version', async () => {
		const { version } = await get(conservator);
		const editors = await Promise.all(Array.from({ length: 20 }, async () => cookieFor((await makeUser('conservator', { tag: 'marks-20' })).user.id)));
		const ids = await Promise.all(editors.map(async (c) => (await (await call('/api/me', { cookie: c })).json()).user.id as string));
		const results = await Promise.all(editors.map((c, i) => put(c, version, layerOf(conservatorId, { marks: [...layerOf(conservatorId).marks, { id: `pin-${i}`, kind: 'pin', part: 'lid', term: 'cracked', severity: 1, note: '', at: [10 + i, 10], authorId: ids[i]!, createdAt: t, updatedAt: t }] }))));
		const statuses = results.map((r) => r.status).sort();
		expect(statuses.filter((s) => s === 200)).toHaveLength(1);
		expect(statuses.filter((s) => s === 409)).toHaveLength(19);
		const now = await get(conservator);
		expect(now.version).toBe(version + 1);
		expect(now.layer.marks).toHaveLength(6);
	});

	it.each([
		['a part that does not exist', (l: MarkLayer) => ({ ...l, marks: [{ ...l.marks[0]!, part: 'handle' }] }), /part must be one of/],
		['a term outside the part’s vocabulary', (l: MarkLayer) => ({ ...l, marks: [{ ...l.marks[0]!, term: 'exploded' }] }), /not a damage term of the seal/],
		['a point outside the photograph', (l: MarkLayer) => ({ ...l, marks: [{ ...l.marks[2]!, at: [5000, 10] }] }), /outside the 1200 × 900 photograph/],
		['two marks with one id', (l: MarkLayer) => ({ ...l, marks: [l.marks[0]!, { ...l.marks[1]!, id: l.marks[0]!.id }] }), /share the id/],
		['an outline of two points', (l: MarkLayer) => ({ ...l, marks: [{ ...l.marks[1]!, points: [[1, 1], [2, 2]] }] }), /at least 3 points/],
		['an outline that crosses itself', (l: MarkLayer) => ({ ...l, marks: [{ ...l.marks[1]!, points: [[400, 400], [520, 520], [520, 400], [400, 520]] }] }), /crosses itself/],
		['a comment pinned to no mark', (l: MarkLayer) => ({ ...l, comments: [{ id: 'c1', markId: 'nowhere', authorId: conservatorId, text: 'x', createdAt: t }] }), /pinned to a mark/],
		['a new mark credited to someone else', (l: MarkLayer) => ({ ...l, marks: [...l.marks, { ...l.marks[2]!, id: 'forged', authorId: reviewerId }] }), /name you as its author/],
		['an unknown field', (l: MarkLayer) => ({ ...l, owner: 'me' }), /not acceptable/],
	])('refuses %s with a clear message and keeps what was saved', async (_name, spoil, message) => {
		const before = await get(conservator);
		const res = await put(conservator, before.version, spoil(before.layer));
		expect(res.status).toBe(400);
		const body = await res.json();
		expect(`${body.error} ${body.fields.map((f: { message: string }) => f.message).join(' ')}`).toMatch(message);
		expect(await get(conservator)).toMatchObject({ version: before.version, layer: before.layer });
	});

	it('refuses a layer over the size limit with 413', async () => {
		const { version } = await get(conservator);
		const huge = { schemaVersion: 1, marks: [], comments: [], padding: 'x'.repeat(5 * 1024 * 1024) };
		expect((await put(conservator, version, huge)).status).toBe(413);
	});

	it('lets a reviewer comment on a mark but not change one; a curator may not save at all', async () => {
		const before = await get(reviewer);
		const changed = { ...before.layer, marks: before.layer.marks.map((m: { id: string }) => (m.id === 'loss' ? { ...m, severity: 1 } : m)) };
		expect((await put(reviewer, before.version, changed)).status).toBe(403);
		const comment = { id: 'rev-1', markId: 'loss', authorId: reviewerId, text: 'Is this loss new since the last check?', createdAt: t };
		const ok = await put(reviewer, before.version, { ...before.layer, comments: [comment] });
		expect(ok.status, await ok.clone().text()).toBe(200);
		expect((await put(curator, before.version + 1, before.layer)).status).toBe(403);
		// The conservator cannot remove or reword the reviewer's comment.
		const now = await get(conservator);
		expect((await put(conservator, now.version, { ...now.layer, comments: [] })).status).toBe(403);
		expect((await put(conservator, now.version, { ...now.layer, comments: [{ ...comment, text: 'Nothing new.' }] })).status).toBe(403);
	});

	it('never answers fuzzed JSON with a 500 or stores it', async () => {
		const { version, layer } = await get(conservator);
		await fc.assert(
			fc.asyncProperty(fc.oneof(fc.json(), fc.record({ version: fc.integer(), layer: fc.jsonValue() }).map((v) => JSON.stringify(v))), async (body) => {
				const r = await fetch(`${baseUrl()}/api/photos/${photoId}/marks`, { method: 'PUT', headers: { cookie: conservator, origin: baseUrl(), 'content-type': 'application/json' }, body });
				expect(r.status).toBeLessThan(500);
			}),
			{ numRuns: 60 },
		);
		expect(await get(conservator)).toMatchObject({ version, layer });
	});
});

describe('the marks of an approved check', () => {
	it('cannot be changed through the API nor in the database', async () => {
		const [row] = await db().query<{ id: string }>(
			`SELECT p.id FROM photos p JOIN condition_checks c ON c.id = p.check_id WHERE c.state = 'approved' LIMIT 1`,
			{ type: QueryTypes.SELECT },
		);
		expect(row).toBeDefined();
		const demoConservator = await signIn('conservator@example.org');
		const res = await call(`/api/photos/${row!.id}/marks`, { cookie: demoConservator });
		const current = await res.json();
		expect(current.mode).toBe('read');
		const save = await call(`/api/photos/${row!.id}/marks`, { method: 'PUT', cookie: demoConservator, json: { version: current.version, layer: current.layer } });
		expect(save.status).toBe(403);
		await expect(db().query(`INSERT INTO mark_layers (photo_id, layer) VALUES (:id, '{"schemaVersion":1,"marks":[],"comments":[]}') ON CONFLICT (photo_id) DO UPDATE SET layer = EXCLUDED.layer`, { replacements: { id: row!.id } })).rejects.toThrow(/approved check cannot be changed/);
	});
});

describe('Web Annotation export and import', () => {
	it('exports the layer as an AnnotationPage on the IIIF image and imports it back unchanged', async () => {
		const before = await get(conservator);
		const res = await call(`/api/photos/${photoId}/annotations`, { cookie: curator });
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toMatch(/application\/ld\+json/);
		const page = await res.json();
		// W3C Web Annotation Data Model §3.1: @context, id, type, target (and body or motivation).
		expect(page.type).toBe('AnnotationPage');
		expect(page.items.length).toBe(before.layer.marks.length + before.layer.comments.length);
		for (const a of page.items) {
			expect(a['@context'] ?? page['@context']).toBeDefined();
			expect(a.type).toBe('Annotation');
			expect(a.id).toEqual(expect.any(String));
			expect(a.target).toBeDefined();
		}
		const svgTarget = page.items.find((a: { target: { selector?: { type: string } } }) => a.target.selector?.type === 'SvgSelector');
		expect(svgTarget.target.source).toMatch(new RegExp(`/api/photos/${photoId}/tiles$`));
		const back = await call(`/api/photos/${photoId}/annotations`, { cookie: conservator, json: { version: before.version, page } });
		expect(back.status, await back.clone().text()).toBe(200);
		const after = await get(conservator);
		expect(after.layer).toEqual(before.layer);
		expect(after.version).toBe(before.version + 1);
	});

	it('refuses a document that is not an annotation page', async () => {
		const { version } = await get(conservator);
		const res = await call(`/api/photos/${photoId}/annotations`, { cookie: conservator, json: { version, page: { hello: 'world' } } });
		expect(res.status).toBe(400);
	});
});
