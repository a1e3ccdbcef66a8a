import fc from 'fast-check';
import { QueryTypes } from 'sequelize';
import { beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, call, useTestDatabase } from '../helpers/server.ts';
import { signedInUser } from '../helpers/users.ts';
import { makeSpecimen, openCheck, uploadPhoto } from '../helpers/photos.ts';
import { db } from '../../src/lib/server/db.ts';
import { analysePair, summaryOf, type ComparedPhoto, type ControlPair } from '../../src/lib/compare/index.ts';
import type { ComparisonSourcePhoto, ComparisonSources, ComparisonView, FluidColourAnswer } from '../../src/lib/compare/view.ts';
import type { Mark, MarkLayer } from '../../src/lib/marks/schema.ts';
import { NO_FLUID_MARK } from '../../src/lib/server/compare/fluidColour.ts';

/**
 * Saved photo comparisons through the API: who may read and save them, bad input refused with
 * nothing stored, the round trip, optimistic locking, the audit trail, and a stored summary that is
 * exactly what src/lib/compare's analysis gives for the same layers and check data.
 */
let conservator: string;
let conservatorId: string;
let reviewer: string;
let reviewerId: string;
let curator: string;
let specimenId: string;
/** Earlier: in a check, marked. Later: outside any check, marked, the loss grown and a new crack. */
let earlierId: string;
let laterId: string;
/** A photo of another specimen. */
let strangerId: string;

const t = '2026-12-01T10:00:00.000Z';

const upload = uploadPhoto;

async function mark(photoId: string, marks: Mark[]): Promise<void> {
	const layer: MarkLayer = { schemaVersion: 1, marks, comments: [] };
	const res = await call(`/api/photos/${photoId}/marks`, { method: 'PUT', cookie: conservator, json: { version: 0, layer } });
	if (res.status !== 200) throw new Error(`marks: ${res.status} ${await res.text()}`);
}

const stamp = () => ({ authorId: conservatorId, createdAt: t, updatedAt: t });
const square = (x: number, y: number, s: number): [number, number][] => [[x, y], [x + s, y], [x + s, y + s], [x, y + s]];

beforeAll(async () => {
	useTestDatabase();
	({ id: conservatorId, cookie: conservator } = await signedInUser('conservator', 'cmp-c'));
	({ id: reviewerId, cookie: reviewer } = await signedInUser('reviewer', 'cmp-r'));
	({ cookie: curator } = await signedInUser('curator', 'cmp-k'));
	specimenId = await makeSpecimen(conservator, 'CMP');
	const check = await openCheck(conservator, specimenId);
	const other = await makeSpecimen(conservator, 'CMQ');
	[earlierId, laterId, strangerId] = await Promise.all([
		upload(conservator, specimenId, 'earlier.jpg', check.id),
		upload(conservator, specimenId, 'later.jpg'),
		upload(conservator, other, 'stranger.jpg'),
	]);
	await mark(earlierId, [
		{ id: 'loss', kind: 'outline', part: 'specimen', term: 'tissue loss', severity: 2, note: '', points: square(400, 400, 100), ...stamp() },
		{ id: 'scale', kind: 'scale', from: [50, 850], to: [650, 850], lengthMm: 100, ...stamp() },
		{ id: 'fluid', kind: 'outline', part: 'fluid', term: 'discoloured', severity: 1, note: '', points: square(100, 100, 200), ...stamp() },
	]);
	await mark(laterId, [
		{ id: 'loss', kind: 'outline', part: 'specimen', term: 'tissue loss', severity: 3, note: '', points: square(400, 400, 140), ...stamp() },
		{ id: 'crack', kind: 'path', part: 'seal', term: 'cracked', severity: 2, note: '', points: [[100, 60], [300, 70]], ...stamp() },
		{ id: 'scale', kind: 'scale', from: [50, 850], to: [650, 850], lengthMm: 100, ...stamp() },
	]);
});

/** Four pairs off a 10 px shift of the later photo: a perspective fit with one spare point. */
const pairs: ControlPair[] = [
	{ n: 1, before: [100, 100], after: [110, 100] },
	{ n: 2, before: [1000, 120], after: [1010, 120] },
	{ n: 3, before: [980, 800], after: [990, 800] },
	{ n: 4, before: [120, 780], after: [130, 780] },
	{ n: 5, before: [600, 450], after: [610, 450] },
];
const input = (over: Record<string, unknown> = {}) => ({ beforePhotoId: earlierId, afterPhotoId: laterId, model: 'perspective', controlPoints: pairs, note: 'Loss at the belly grown.', ...over });
const post = (cookie: string | undefined, body: unknown, specimen = specimenId) => call(`/api/specimens/${specimen}/comparisons`, { cookie, json: body });
const put = (cookie: string | undefined, id: string, version: number, comparison: unknown) => call(`/api/comparisons/${id}`, { method: 'PUT', cookie, json: { version, comparison } });
const stored = async () =>
	Number((await db().query<{ n: string }>(`SELECT count(*)::text AS n FROM photo_comparisons WHERE specimen_id = :specimenId`, { replacements: { specimenId }, type: QueryTypes.SELECT }))[0]!.n);

async function created(cookie = conservator, body = input()): Promise<ComparisonView> {
	const res = await post(cookie, body);
	expect(res.status, await res.clone().text()).toBe(201);
	return ((await res.json()) as { comparison: ComparisonView }).comparison;
}

async function sources(specimen: string, cookie = curator): Promise<ComparisonSources> {
	const res = await call(`/api/specimens/${specimen}/comparison-sources`, { cookie });
	expect(res.status).toBe(200);
	return res.json();
}

const fluidColour = async (photoId: string): Promise<FluidColourAnswer> => ((await (await call(`/api/photos/${photoId}/fluid-colour`, { cookie: curator })).json()) as { colour: FluidColourAnswer }).colour;
const compared = (p: ComparisonSourcePhoto): ComparedPhoto => ({ width: p.width, height: p.height, layer: p.layer.layer, date: p.date, levelMm: p.check?.levelMm ?? null });

describe('the photographs a comparison can use', () => {
	it('are the ready photographs of the specimen, newest first, with their checks, display sizes and layers', async () => {
		const s = await sources(specimenId);
		expect(s.specimen).toMatchObject({ id: specimenId, objectNumber: expect.stringMatching(/^CMP\./) });
		expect(s.photos.map((p) => p.id).sort()).toEqual([earlierId, laterId].sort());
		const earlier = s.photos.find((p) => p.id === earlierId)!;
		expect(earlier).toMatchObject({
			width: 1200,
			height: 900,
			view: 'front',
			stage: 'as-found',
			urls: { display: `/api/photos/${earlierId}/display`, thumbnail: `/api/photos/${earlierId}/thumbnail` },
			display: { width: 1200, height: 900 },
			check: { checkedOn: expect.stringMatching(/^\d{4}-\d{2}-\d{2}$/), status: 'draft', examinerId: conservatorId, examinerName: 'Test conservator', levelMm: null },
			layer: { version: 1 },
		});
		expect(earlier.layer.layer.marks.map((m) => m.id)).toEqual(['loss', 'scale', 'fluid']);
		expect(s.photos.find((p) => p.id === laterId)!.check).toBeNull();
		// Each is dated by its check, or by its capture day; the newest comes first.
		expect(s.photos.map((p) => p.date)).toEqual([...s.photos.map((p) => p.date)].sort().reverse());
	});

	it('give 404 for a specimen that does not exist', async () => {
		expect((await call('/api/specimens/00000000-0000-4000-8000-000000000000/comparison-sources', { cookie: curator })).status).toBe(404);
	});
});

describe('saving a comparison', () => {
	it('is for conservators and reviewers; curators may read; nobody signed out', async () => {
		const mine = await created(conservator);
		const theirs = await created(reviewer);
		expect(theirs.createdBy).toEqual({ id: reviewerId, name: 'Test reviewer' });
		const before = await stored();
		expect((await post(curator, input())).status).toBe(403);
		expect((await put(curator, mine.id, mine.version, input())).status).toBe(403);
		expect((await post(undefined, input())).status).toBe(401);
		expect((await put(undefined, mine.id, mine.version, input())).status).toBe(401);
		expect(await stored()).toBe(before);
		expect((await call(`/api/comparisons/${mine.id}`, { cookie: curator })).status).toBe(200);
		expect((await call(`/api/specimens/${specimenId}/comparisons`, { cookie: curator })).status).toBe(200);
		for (const path of [`/api/comparisons/${mine.id}`, `/api/specimens/${specimenId}/comparisons`, `/api/specimens/${specimenId}/comparison-sources`, `/api/photos/${earlierId}/fluid-colour`]) {
			expect((await call(path)).status, path).toBe(401);
		}
	});

	it.each([
		['the same photograph twice', () => input({ afterPhotoId: earlierId }), /two different photographs/],
		['a photograph of another specimen', () => input({ afterPhotoId: strangerId }), /of another specimen/],
		['a photograph that does not exist', () => input({ beforePhotoId: '00000000-0000-4000-8000-000000000000' }), /does not exist/],
		['three pairs for a perspective fit', () => input({ controlPoints: pairs.slice(0, 3) }), /enough pairs of control points/],
		['a photo id that is not a uuid', () => input({ beforePhotoId: 'IMG_0042.jpg' }), /Choose a photograph/],
		['two pairs with one number', () => input({ controlPoints: [...pairs.slice(0, 4), { ...pairs[4]!, n: 1 }] }), /same number/],
		['a control point off the photograph', () => input({ controlPoints: [...pairs.slice(0, 4), { n: 9, before: [5000, 10], after: [10, 10] }] }), /Control point 9 is outside the earlier photograph/],
		['control points in a line', () => input({ model: 'affine', controlPoints: [0, 1, 2].map((i) => ({ n: i + 1, before: [100 * i, 100 * i], after: [100 * i, 100 * i] })) }), /cannot be used/],
		['an unknown model', () => input({ model: 'rigid' }), /registration is one of/],
		['an unknown field', () => ({ ...input(), summary: { counts: {} } }), /not acceptable/],
	])('refuses %s with 400 and stores nothing', async (_name, body, message) => {
		const before = await stored();
		const res = await post(conservator, body());
		expect(res.status).toBe(400);
		const answer = (await res.json()) as { error: string; fields: { message: string }[] };
		expect(`${answer.error} ${answer.fields.map((f) => f.message).join(' ')}`).toMatch(message);
		expect(await stored()).toBe(before);
	});

	it('gives 404 for a specimen or a comparison that does not exist', async () => {
		const nobody = '00000000-0000-4000-8000-000000000000';
		expect((await post(conservator, input(), nobody)).status).toBe(404);
		expect((await call(`/api/comparisons/${nobody}`, { cookie: curator })).status).toBe(404);
		expect((await put(conservator, nobody, 1, input())).status).toBe(404);
		expect((await call(`/api/specimens/${nobody}/comparisons`, { cookie: curator })).status).toBe(404);
	});

	it('reads back exactly what was saved, and lists it first', async () => {
		const c = await created();
		expect(c).toMatchObject({
			specimenId,
			beforePhotoId: earlierId,
			afterPhotoId: laterId,
			model: 'perspective',
			controlPoints: pairs,
			note: 'Loss at the belly grown.',
			version: 1,
			createdBy: { id: conservatorId, name: 'Test conservator' },
			updatedBy: { id: conservatorId, name: 'Test conservator' },
		});
		expect(c.transform).toHaveLength(3);
		const got = await call(`/api/comparisons/${c.id}`, { cookie: curator });
		expect((await got.json()).comparison).toEqual(c);
		const list = (await (await call(`/api/specimens/${specimenId}/comparisons`, { cookie: curator })).json()).comparisons;
		const photos = (await sources(specimenId)).photos;
		const [earlier, later] = [earlierId, laterId].map((id) => photos.find((p) => p.id === id)!);
		expect(list[0]).toEqual({
			id: c.id,
			beforePhotoId: earlierId,
			afterPhotoId: laterId,
			beforeDate: earlier!.check!.checkedOn,
			afterDate: later!.date,
			model: 'perspective',
			counts: c.summary.counts,
			createdBy: { id: conservatorId, name: 'Test conservator' },
			updatedAt: c.updatedAt,
		});
	});

	it('stores the summary src/lib/compare computes from the same layers, checks and fluid colours', async () => {
		const c = await created();
		const photos = (await sources(specimenId)).photos;
		const [before, after] = [earlierId, laterId].map((id) => photos.find((p) => p.id === id)!);
		const colour = { before: await fluidColour(earlierId), after: await fluidColour(laterId) };
		const analysis = analysePair(compared(before!), compared(after!), 'perspective', pairs, colour);
		expect(c.summary).toEqual(JSON.parse(JSON.stringify(summaryOf(analysis))));
		expect(c.transform).toEqual(analysis.registration.transform);
		// What that means here: the loss grew, the crack is new, the later photo has no fluid outline.
		expect(c.summary.counts).toMatchObject({ grown: 1, new: 1 });
		expect(c.summary.aligned).toBe(true);
		expect(c.summary.colour.problem).toMatch(/Later photograph: Outline the fluid/);
		expect(c.summary.colour.before).toMatchObject({ reliable: false });
	});

	it('compares unaligned without control points, and stores no transform', async () => {
		const c = await created(reviewer, input({ model: 'none', controlPoints: [] }));
		expect(c.transform).toBeNull();
		expect(c.summary.aligned).toBe(false);
		expect(c.summary.registration).toMatchObject({ model: 'none', rmsPx: null });
	});
});

describe('changing a saved comparison', () => {
	it('takes the version it was loaded at, and refuses a stale one with the comparison as it is', async () => {
		const c = await created();
		const res = await put(reviewer, c.id, c.version, input({ model: 'affine', controlPoints: pairs.slice(0, 4), note: 'Checked: the loss has grown.' }));
		expect(res.status, await res.clone().text()).toBe(200);
		const now = ((await res.json()) as { comparison: ComparisonView }).comparison;
		expect(now).toMatchObject({ id: c.id, version: 2, model: 'affine', note: 'Checked: the loss has grown.', createdBy: { id: conservatorId }, updatedBy: { id: reviewerId, name: 'Test reviewer' } });
		expect(now.summary.registration.model).toBe('affine');
		const stale = await put(conservator, c.id, c.version, input({ note: 'Mine.' }));
		expect(stale.status).toBe(409);
		const body = (await stale.json()) as { error: string; current: ComparisonView };
		expect(body.error).toMatch(/saved this comparison after you opened it/);
		expect(body.current).toEqual(now);
		expect((await (await call(`/api/comparisons/${c.id}`, { cookie: curator })).json()).comparison).toEqual(now);
	});

	it('lets exactly one of several simultaneous savers commit a version', async () => {
		const c = await created();
		const results = await Promise.all(Array.from({ length: 6 }, (_, i) => put(i % 2 ? reviewer : conservator, c.id, c.version, input({ note: `Saver ${i}.` }))));
		const statuses = results.map((r) => r.status);
		expect(statuses.filter((s) => s === 200)).toHaveLength(1);
		expect(statuses.filter((s) => s === 409)).toHaveLength(5);
		const now = (await (await call(`/api/comparisons/${c.id}`, { cookie: curator })).json()).comparison as ComparisonView;
		expect(now.version).toBe(2);
		expect(now.note).toBe(`Saver ${statuses.indexOf(200)}.`);
	});

	it('never answers fuzzed JSON with a 500 or stores it', async () => {
		const c = await created();
		const before = await stored();
		await fc.assert(
			fc.asyncProperty(fc.oneof(fc.json(), fc.record({ version: fc.integer(), comparison: fc.jsonValue() }).map((v) => JSON.stringify(v))), async (body) => {
				for (const [method, path] of [['POST', `/api/specimens/${specimenId}/comparisons`], ['PUT', `/api/comparisons/${c.id}`]] as const) {
					const r = await fetch(`${baseUrl()}${path}`, { method, headers: { cookie: conservator, origin: baseUrl(), 'content-type': 'application/json' }, body });
					expect(r.status).toBeLessThan(500);
				}
			}),
			{ numRuns: 40 },
		);
		expect(await stored()).toBe(before);
		expect((await (await call(`/api/comparisons/${c.id}`, { cookie: curator })).json()).comparison).toEqual(c);
	});

	it('refuses bad input with 400 and keeps what was saved', async () => {
		const c = await created();
		expect((await put(conservator, c.id, c.version, input({ afterPhotoId: strangerId }))).status).toBe(400);
		expect((await put(conservator, c.id, c.version, input({ controlPoints: pairs.slice(0, 2) }))).status).toBe(400);
		expect((await (await call(`/api/comparisons/${c.id}`, { cookie: curator })).json()).comparison).toEqual(c);
	});

	it('writes an audit event with each save, in the same transaction', async () => {
		const c = await created();
		await put(conservator, c.id, c.version, input({ note: 'Again.' }));
		const rows = await db().query<{ action: string; actor_id: string; before: { version: number } | null; after: { version: number; model: string; counts: object; specimenId?: string } }>(
			`SELECT action, actor_id, before, after FROM audit_events WHERE entity_type = 'comparison' AND entity_id = :id ORDER BY id`,
			{ replacements: { id: c.id }, type: QueryTypes.SELECT },
		);
		expect(rows.map((r) => r.action)).toEqual(['comparison.created', 'comparison.updated']);
		expect(rows[0]).toMatchObject({ actor_id: conservatorId, before: null, after: { specimenId, version: 1, model: 'perspective', counts: c.summary.counts } });
		expect(rows[1]).toMatchObject({ before: { version: 1 }, after: { version: 2 } });
	});

	it('is guarded by the database too: two different photographs, a known model', async () => {
		const insert = (before: string, after: string, model: string) =>
			db().query(
				`INSERT INTO photo_comparisons (specimen_id, before_photo_id, after_photo_id, model, summary, created_by, updated_by) VALUES (:specimenId, :before, :after, :model, '{}', :user, :user)`,
				{ replacements: { specimenId, before, after, model, user: conservatorId } },
			);
		await expect(insert(earlierId, earlierId, 'none')).rejects.toThrow(/photo_comparisons_two_photos/);
		await expect(insert(earlierId, laterId, 'rigid')).rejects.toThrow(/photo_comparisons_model_check/);
	});
});

describe('the fluid colour of a photograph', () => {
	it('is measured on a demo photograph with a grey reference and a fluid mark, and reliable', async () => {
		const demo = await db().query<{ id: string }>(
			`SELECT p.id FROM photos p JOIN mark_layers m ON m.photo_id = p.id JOIN specimens s ON s.id = p.specimen_id
			 WHERE s.object_number LIKE 'STC.%'
			   AND EXISTS (SELECT 1 FROM jsonb_array_elements(m.layer->'marks') x WHERE x->>'part' = 'fluid' AND x->>'kind' IN ('box', 'outline'))
			   AND EXISTS (SELECT 1 FROM jsonb_array_elements(m.layer->'marks') x WHERE x->>'kind' = 'grey')
			 ORDER BY s.object_number`,
			{ type: QueryTypes.SELECT },
		);
		expect(demo.length).toBeGreaterThan(0);
		for (const { id } of demo) {
			const c = await fluidColour(id);
			expect(c, id).toMatchObject({ reliable: true, whiteBalanced: true, reasons: [], illuminant: 'D65/2' });
			if ('lab' in c) expect(c.lab[0]).toBeGreaterThan(0);
		}
	});

	it('says what to mark on a photograph without a fluid outline', async () => {
		expect(await fluidColour(strangerId)).toEqual({ problem: NO_FLUID_MARK });
	});

	it('is measured but not trusted without a grey reference', async () => {
		const c = await fluidColour(earlierId);
		expect(c).toMatchObject({ reliable: false, whiteBalanced: false, reasons: [expect.stringMatching(/No grey reference/)] });
	});

	it('gives 404 for a photograph that does not exist', async () => {
		expect((await call('/api/photos/00000000-0000-4000-8000-000000000000/fluid-colour', { cookie: curator })).status).toBe(404);
	});
});

describe('the demo showcase jar', () => {
	it('offers its last two checks photographed, with their layers, to compare', async () => {
		const [jar] = await db().query<{ id: string }>(`SELECT id FROM specimens WHERE object_number = 'STC.1898.014'`, { type: QueryTypes.SELECT });
		const id = jar!.id;
		const s = await sources(id);
		expect(s.specimen.objectNumber).toBe('STC.1898.014');
		const front = s.photos.filter((p) => p.view === 'front' && p.check);
		expect(front.length).toBeGreaterThanOrEqual(2);
		const [later, earlier] = front;
		expect(later!.check!.checkedOn > earlier!.check!.checkedOn).toBe(true);
		for (const p of [later!, earlier!]) {
			expect(p.layer.version).toBeGreaterThanOrEqual(1);
			expect(p.layer.layer.marks.map((m) => m.kind)).toEqual(expect.arrayContaining(['scale', 'grey', 'level']));
			expect(p.check!.levelMm).not.toBeNull();
		}
		// A reviewer compares them before deciding on the newer check.
		const res = await post(reviewer, { beforePhotoId: earlier!.id, afterPhotoId: later!.id, model: 'none', controlPoints: [], note: '' }, id);
		expect(res.status, await res.clone().text()).toBe(201);
		const { comparison } = (await res.json()) as { comparison: ComparisonView };
		expect(comparison.summary.levelFromReadings).toMatchObject({ beforeMm: earlier!.check!.levelMm, afterMm: later!.check!.levelMm });
	});
});
