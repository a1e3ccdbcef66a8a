import { expect } from 'vitest';
import autocannon, { type Result } from 'autocannon';
import { QueryTypes } from 'sequelize';
import { baseUrl, call } from './server.ts';
import { db } from '../../src/lib/server/db.ts';

/**
 * The signed-in reads the load tests send (TESTPLAN L1, L2): the register query, a record, the
 * home figures, and for up to three prepared photos their IIIF info.json, a tile and their marks,
 * plus one display copy. Each is checked to answer 200 first, so a load run measures real answers.
 */
export async function readPaths(cookie: string): Promise<string[]> {
	const photos = await db().query<{ id: string; specimen_id: string }>(
		`SELECT p.id, p.specimen_id FROM photos p WHERE EXISTS (SELECT 1 FROM photo_derivatives d WHERE d.photo_id = p.id AND d.kind = 'tiles') ORDER BY p.id LIMIT 3`,
		{ type: QueryTypes.SELECT },
	);
	expect(photos.length).toBeGreaterThan(0);
	const paths = [
		'/api/specimens?q=STC&sort=objectNumber',
		`/api/specimens/${photos[0]!.specimen_id}`,
		'/api/home',
		...photos.flatMap((p) => [`/api/photos/${p.id}/tiles/info.json`, `/api/photos/${p.id}/tiles/0,0,512,512/512,512/0/default.jpg`, `/api/photos/${p.id}/marks`]),
		`/api/photos/${photos[0]!.id}/display`,
	];
	for (const p of paths) expect((await call(p, { cookie })).status, p).toBe(200);
	return paths;
}

/** autocannon on loopback: `connections` signed-in readers going round `paths` for `seconds`. */
export function readLoad(cookie: string, paths: string[], o: { connections: number; seconds: number }): Promise<Result> {
	return autocannon({ url: baseUrl(), connections: o.connections, duration: o.seconds, timeout: 10, headers: { cookie }, requests: paths.map((path) => ({ method: 'GET', path })) });
}

/** One line of autocannon's figures, tagged (e.g. `[L1 reads]`). */
export function latencyLine(tag: string, r: Result): string {
	return `[${tag}] ${r.requests.total} requests in ${r.duration.toFixed(0)} s (${r.requests.average.toFixed(0)}/s); latency p50 ${r.latency.p50} ms, p90 ${r.latency.p90} ms, p99 ${r.latency.p99} ms, max ${r.latency.max} ms; errors ${r.errors}, timeouts ${r.timeouts}, non-2xx ${r.non2xx}`;
}
