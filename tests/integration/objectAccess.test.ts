import { QueryTypes } from 'sequelize';
import { beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, call, useTestDatabase } from '../helpers/server.ts';
import { gradedCheck } from '../helpers/checks.ts';
import { tusHead } from '../helpers/photos.ts';
import { buildWorld, worldLayer, type Person, type World } from '../helpers/world.ts';
import { db } from '../../src/lib/server/db.ts';
import { PhotoUpload } from '../../src/lib/server/models/index.ts';

/**
 * TESTPLAN A2 (ASVS 5.0 8.2.2 object-level access, 16.3.2 authorisation failures logged; WSTG
 * ATHZ-04 IDOR): conservator B, a reviewer and a curator against conservator A's draft check and
 * everything hanging off it. The product's rules, as stated: records are read by everyone signed in
 * (DESIGN.md §2: reviewers read all a conservator may, curators read everything; ROUTE_RULES);
 * masters only by conservators, reviewers and administrators; drafts are shared among conservators
 * (lib/check/workflow.ts has no owner rule), but marks keep their author (lib/marks/policy.ts); and
 * an upload belongs to whoever started it (server/photos/uploads.ts, uploadOf). Where access is
 * refused, the answer is the one a missing id gets, so probing tells nothing.
 */
let w: World;
const MISSING = '00000000-0000-4000-8000-00000000beef';

beforeAll(async () => {
	useTestDatabase();
	w = await buildWorld('idor');
});

/** Every way of reading A's draft, with the photo id in it replaceable by a missing one. */
async function readPaths(photo: string): Promise<Record<string, string>> {
	const info = await (await call(`/api/photos/${w.photoId}/tiles/info.json`, { cookie: w.a.cookie })).json();
	const [tw, th] = [Math.min(512, info.width), Math.min(512, info.height)];
	return {
		check: `/api/checks/${w.checkId}`,
		'check page': `/checks/${w.checkId}`,
		'check photos': `/api/checks/${w.checkId}/photos`,
		report: `/api/checks/${w.checkId}/report.pdf`,
		photo: `/api/photos/${photo}`,
		marks: `/api/photos/${photo}/marks`,
		thumbnail: `/api/photos/${photo}/thumbnail`,
		display: `/api/photos/${photo}/display`,
		'tile info': `/api/photos/${photo}/tiles/info.json`,
		tile: `/api/photos/${photo}/tiles/0,0,${tw},${th}/${tw},${th}/0/default.jpg`,
		comparison: `/api/comparisons/${w.comparisonId}`,
		manifest: `/api/specimens/${w.specimenId}/manifest`,
	};
}

const answerOf = async (res: Response) => ({ status: res.status, type: res.headers.get('content-type'), body: await res.text() });

describe('reading A’s draft (everyone signed in reads records)', () => {
	it('is open to another conservator, a reviewer and a curator', async () => {
		for (const who of ['b', 'reviewer', 'curator'] as const) {
			for (const [what, path] of Object.entries(await readPaths(w.photoId))) {
				expect((await call(path, { cookie: w[who].cookie })).status, `${what} as ${who}`).toBe(200);
			}
		}
	});

	it('keeps the master from a curator, with the same answer as for a photo that does not exist', async () => {
		expect((await call(`/api/photos/${w.photoId}/original`, { cookie: w.b.cookie })).status).toBe(200);
		const mine = await answerOf(await call(`/api/photos/${w.photoId}/original`, { cookie: w.curator.cookie }));
		expect(mine.status).toBe(403);
		expect(mine).toEqual(await answerOf(await call(`/api/photos/${MISSING}/original`, { cookie: w.curator.cookie })));
	});

	it('answers a missing photo the same on every photo route, whoever asks', async () => {
		const missing = await readPaths(MISSING);
		for (const what of ['photo', 'marks', 'thumbnail', 'display', 'tile info', 'tile'] as const) {
			const path = missing[what]!;
			const [b, c] = [await answerOf(await call(path, { cookie: w.b.cookie })), await answerOf(await call(path, { cookie: w.curator.cookie }))];
			expect(b.status, what).toBe(404);
			expect(c, what).toEqual(b);
		}
	});
});

describe('changing A’s draft (shared among conservators; marks keep their author)', () => {
	it('lets B save the check and add marks of B’s own, but not pass A’s marks off as B’s or B’s as A’s', async () => {
		const { check } = await (await call(`/api/checks/${w.checkId}`, { cookie: w.b.cookie })).json();
		expect((await call(`/api/checks/${w.checkId}`, { method: 'PUT', cookie: w.b.cookie, json: { version: check.version, check: gradedCheck('Seen by B too.') } })).status).toBe(200);
		const { version, layer } = await (await call(`/api/photos/${w.photoId}/marks`, { cookie: w.b.cookie })).json();
		const put = (l: unknown) => call(`/api/photos/${w.photoId}/marks`, { method: 'PUT', cookie: w.b.cookie, json: { version, layer: l } });
		const stolen = { ...layer, marks: layer.marks.map((m: { authorId: string }) => ({ ...m, authorId: w.b.id })) };
		expect((await put(stolen)).status).toBe(400);
		const [extra] = worldLayer(w.a.id).marks.map((m) => ({ ...m, id: 'by-b' }));
		expect((await put({ ...layer, marks: [...layer.marks, extra] })).status).toBe(400);
		expect((await put({ ...layer, marks: [...layer.marks, { ...extra, authorId: w.b.id }] })).status).toBe(200);
	});
});

describe('A’s unfinished upload (an upload is its uploader’s own)', () => {
	const probe = (path: string, method: string, who: Person) =>
		call(path, { method, cookie: who.cookie, headers: { 'tus-resumable': '1.0.0', 'upload-offset': '0', 'content-type': 'application/offset+octet-stream' } });

	it('answers B exactly as it answers an upload nobody started, changes nothing, and logs the attempt', async () => {
		const nobodys = `/api/uploads/${'f'.repeat(32)}`;
		for (const method of ['HEAD', 'PATCH', 'DELETE']) {
			const a = await answerOf(await probe(w.uploadPath, method, w.b));
			expect(a.status, method).toBe(404);
			expect(a, method).toEqual(await answerOf(await probe(nobodys, method, w.b)));
		}
		const id = w.uploadPath.split('/').pop()!;
		expect(await answerOf(await call(`/api/uploads/status?id=${id}`, { cookie: w.b.cookie }))).toEqual(await answerOf(await call(`/api/uploads/status?id=${'f'.repeat(32)}`, { cookie: w.b.cookie })));
		// Still A's, still waiting at offset 0.
		expect(await PhotoUpload.findByPk(id)).toMatchObject({ uploaderId: w.a.id, state: 'receiving' });
		expect((await tusHead(new URL(w.uploadPath, baseUrl()).href, w.a.cookie)).offset).toBe(0);
		const [logged] = await db().query<{ n: number }>(`SELECT count(*)::int AS n FROM audit_events WHERE action = 'access.refused' AND entity_type = 'photo_upload' AND entity_id = :id AND actor_id = :b`, {
			replacements: { id, b: w.b.id },
			type: QueryTypes.SELECT,
		});
		expect(logged!.n).toBe(3);
	});
});
