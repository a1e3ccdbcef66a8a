import { QueryTypes } from 'sequelize';
import { beforeAll, describe, expect, it } from 'vitest';
import { z } from 'zod';
import { baseUrl, call, useTestDatabase } from '../helpers/server.ts';
import { signedInUser } from '../helpers/users.ts';
import { db } from '../../src/lib/server/db.ts';

/**
 * The IIIF Presentation 3 manifest of the demo's showcase jar (the test set-up photographs its last
 * two checks): the required structure of IIIF Presentation API 3.0 (§3 Resource types, §5
 * Resource structure, https://iiif.io/api/presentation/3.0/) parsed with a zod schema of it, every
 * id the app serves answering with the session, canvases the photos' size, painting annotations on
 * their canvas, and one mark annotation per mark of the photo's layer.
 */
const Lang = z.record(z.string(), z.array(z.string()).min(1));
const ImageService3 = z.object({ id: z.url(), type: z.literal('ImageService3'), profile: z.enum(['level0', 'level1', 'level2']) });
const Annotation = z.object({
	id: z.url(),
	type: z.literal('Annotation'),
	motivation: z.union([z.string(), z.array(z.string())]),
	body: z.object({ id: z.url(), type: z.literal('Image'), format: z.string(), width: z.number().int().positive(), height: z.number().int().positive(), service: z.array(ImageService3).min(1) }),
	target: z.url(),
});
const AnnotationPage = z.object({ id: z.url(), type: z.literal('AnnotationPage'), items: z.array(Annotation) });
const Canvas = z.object({
	id: z.url(),
	type: z.literal('Canvas'),
	label: Lang,
	width: z.number().int().positive(),
	height: z.number().int().positive(),
	items: z.array(AnnotationPage).min(1),
	annotations: z.array(z.object({ id: z.url(), type: z.literal('AnnotationPage') })).optional(),
});
const Manifest = z.object({
	'@context': z.union([z.literal('http://iiif.io/api/presentation/3/context.json'), z.array(z.string()).refine((a) => a.at(-1) === 'http://iiif.io/api/presentation/3/context.json')]),
	id: z.url(),
	type: z.literal('Manifest'),
	label: Lang,
	metadata: z.array(z.object({ label: Lang, value: Lang })).optional(),
	summary: Lang.optional(),
	items: z.array(Canvas),
});
const MarkPage = z.object({
	id: z.url(),
	type: z.literal('AnnotationPage'),
	items: z.array(z.object({ id: z.string(), type: z.literal('Annotation'), motivation: z.string(), target: z.unknown(), 'meniscus:mark': z.unknown().optional() })),
});

let cookie: string;
let specimenId: string;
let manifestUrl: string;

beforeAll(async () => {
	useTestDatabase();
	({ cookie } = await signedInUser('curator', 'iiif'));
	const [row] = await db().query<{ id: string }>(`SELECT id FROM specimens WHERE object_number = 'STC.1898.014'`, { type: QueryTypes.SELECT });
	specimenId = row!.id;
	manifestUrl = `${baseUrl()}/api/specimens/${specimenId}/manifest`;
});

/** A GET with the session cookie, or signed out (null). */
const get = (url: string, c: string | null = cookie) => fetch(url, { headers: c ? { cookie: c } : {}, redirect: 'manual' });

describe('the IIIF manifest of a specimen', () => {
	it('has the IIIF Presentation 3 structure, with ids the app serves and marks on the canvases', async () => {
		const t0 = new Date();
		const res = await get(manifestUrl);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('application/ld+json;profile="http://iiif.io/api/presentation/3/context.json"');
		const manifest = Manifest.parse(await res.json());
		expect(manifest.id).toBe(manifestUrl);
		expect(manifest.label.en![0]).toContain('STC.1898.014');
		const photos = await db().query<{ id: string; width: number; height: number; checked_on: string; ready_before: boolean }>(
			// A photo outside a check (another test file may upload one meanwhile) is dated by its capture, else its upload.
			`SELECT p.id, p.width, p.height, p.created_at < :t0 AND EXISTS (SELECT 1 FROM photo_derivatives d WHERE d.photo_id = p.id AND d.kind = 'display') AS ready_before,
			        coalesce(c.checked_on::text, to_char(coalesce(p.captured_at, p.uploaded_at) AT TIME ZONE 'UTC', 'YYYY-MM-DD')) AS checked_on
			 FROM photos p LEFT JOIN condition_checks c ON c.id = p.check_id WHERE p.specimen_id = :id`,
			{ type: QueryTypes.SELECT, replacements: { id: specimenId, t0 } },
		);
		// The set-up photographs the showcase jar's last two checks.
		expect(new Set(photos.map((p) => p.checked_on)).size).toBeGreaterThanOrEqual(2);
		// Every photo ready before the request is a canvas, and every canvas is a photo of the jar
		// (another test file may add one meanwhile).
		const canvasIds = new Set(manifest.items.map((c) => c.id.split('/').at(-1)!));
		expect(photos.filter((p) => p.ready_before).every((p) => canvasIds.has(p.id))).toBe(true);
		expect([...canvasIds].every((id) => photos.some((p) => p.id === id))).toBe(true);
		const byId = new Map(photos.map((p) => [p.id, p]));
		let previous = '';
		for (const canvas of manifest.items) {
			const photoId = canvas.id.split('/').at(-1)!;
			const photo = byId.get(photoId)!;
			expect(canvas.id).toBe(`${manifestUrl}/canvas/${photoId}`);
			expect([canvas.width, canvas.height]).toEqual([photo.width, photo.height]);
			// Chronological: the oldest check first.
			expect(photo.checked_on >= previous).toBe(true);
			previous = photo.checked_on;
			expect(canvas.label.en![0]).toContain(photo.checked_on);
			for (const page of canvas.items) {
				for (const a of page.items) {
					expect(a.motivation).toBe('painting');
					expect(a.target).toBe(canvas.id);
					expect((await get(a.body.id)).status).toBe(200);
					const info = await get(`${a.body.service[0]!.id}/info.json`);
					expect(info.status).toBe(200);
					const described = (await info.json()) as { id: string; width: number; height: number };
					expect(described.id).toBe(a.body.service[0]!.id);
					expect([described.width, described.height]).toEqual([photo.width, photo.height]);
				}
			}
			const [ref] = canvas.annotations ?? [];
			expect(ref).toBeDefined();
			const pageRes = await get(ref!.id);
			expect(pageRes.status, await pageRes.clone().text()).toBe(200);
			const page = MarkPage.parse(await pageRes.json());
			expect(page.id).toBe(ref!.id);
			const marks = (await (await get(`${baseUrl()}/api/photos/${photoId}/marks`)).json()) as { layer: { marks: unknown[] } };
			const markAnnotations = page.items.filter((i) => i['meniscus:mark'] !== undefined);
			expect(markAnnotations).toHaveLength(marks.layer.marks.length);
			for (const m of markAnnotations) expect(m.target).toMatchObject({ type: 'SpecificResource', source: canvas.id, selector: { type: 'SvgSelector' } });
		}
		// The showcase's seal crack is marked, so at least one canvas has marks to show.
		const counts = await Promise.all(manifest.items.map(async (c) => MarkPage.parse(await (await get(c.annotations![0]!.id)).json()).items.length));
		expect(counts.some((n) => n > 0)).toBe(true);
	});

	it('is for signed-in people only, and 404 for an unknown specimen or a photo of another', async () => {
		expect((await get(manifestUrl, null)).status).toBe(401);
		expect((await call(`/api/specimens/00000000-0000-4000-8000-000000000000/manifest`, { cookie })).status).toBe(404);
		expect((await call(`/api/specimens/not-an-id/manifest`, { cookie })).status).toBe(404);
		const [other] = await db().query<{ id: string }>(`SELECT id FROM photos WHERE specimen_id <> :id LIMIT 1`, { type: QueryTypes.SELECT, replacements: { id: specimenId } });
		expect((await get(`${manifestUrl}/annotations/${other!.id}`)).status).toBe(404);
		expect((await get(`${manifestUrl}/annotations/${other!.id}`, null)).status).toBe(401);
	});
});
