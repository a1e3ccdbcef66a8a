import { beforeAll, describe, expect, inject, it } from 'vitest';
import { call, useTestDatabase } from '../helpers/server.ts';
import { signedInUser } from '../helpers/users.ts';
import { specimenRecord } from '../helpers/specimens.ts';
import { sampleJpeg, settled, tusUpload } from '../helpers/photos.ts';
import { startCluster, stopCluster } from '../../db/cluster.mjs';

/**
 * TESTPLAN F6, the database stops mid-request (ASVS 5.0 2.3.3 atomic writes, 16.5.2 degrade
 * gracefully; PostgreSQL's crash recovery): while people save records, PostgreSQL is stopped with
 * `pg_ctl stop -m immediate` (a crash: no checkpoint, recovery from the WAL at the next start),
 * then started again. Pass: every answer is a success or a clear 503 (never a 500, never a hang);
 * the app and the photo worker recover by themselves; every acknowledged save reads back, and a save
 * whose answer was lost either committed whole (the retry is told so by a 409 with that value) or
 * not at all.
 */
const SAVERS = 4;
let cookie = '';
type Target = { id: string; record: Record<string, unknown>; version: number; title: string };
const targets: Target[] = [];

beforeAll(async () => {
	useTestDatabase();
	({ cookie } = await signedInUser('conservator', 'outage'));
	for (let i = 0; i < SAVERS; i++) {
		const record = specimenRecord(`DB${process.pid}`);
		const res = await call('/api/specimens', { cookie, json: record });
		expect(res.status).toBe(201);
		const { specimen } = await res.json();
		targets.push({ id: specimen.id, record, version: specimen.version, title: record.title });
	}
});

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe('PostgreSQL stopping mid-request (TESTPLAN F6)', () => {
	it('answers 503 while it is down, recovers by itself, and keeps every acknowledged save', async () => {
		const statuses = new Map<number, number>();
		const bodies503: string[] = [];
		let running = true;
		let n = 0;
		const saver = async (t: Target) => {
			let pending: string | null = null;
			while (running) {
				const title: string = pending ?? `Outage newt ${++n}`;
				const res: Response | null = await call(`/api/specimens/${t.id}`, { cookie, method: 'PUT', json: { version: t.version, record: { ...t.record, title } } }).catch(() => null);
				const status = res?.status ?? 0;
				statuses.set(status, (statuses.get(status) ?? 0) + 1);
				// eslint-disable-next-line @typescript-eslint/no-explicit-any
				const body: any = res ? await res.json().catch(() => null) : null;
				if (status === 200) {
					[t.version, t.title, pending] = [body.specimen.version, title, null];
				} else if (status === 503) {
					bodies503.push(body?.error ?? '');
					pending = title; // The same save again, naming the same version.
					await sleep(200);
				} else if (status === 409 && pending !== null && body?.current?.version === t.version + 1 && body.current.title === pending) {
					// The lost answer's save had committed whole before the crash.
					[t.version, t.title, pending] = [body.current.version, pending, null];
				} else {
					throw new Error(`unexpected answer ${status}: ${JSON.stringify(body)}`);
				}
			}
		};
		const savers = targets.map(saver);
		await sleep(1_500);
		const dataDir = inject('clusterDataDir');
		await stopCluster({ dataDir, mode: 'immediate', log: () => {} });
		await sleep(3_000);
		const down = (await call('/api/me', { cookie })).status;
		await startCluster({ dataDir, port: inject('clusterPort'), database: new URL(inject('databaseUrl')).pathname.slice(1), log: () => {} });
		// Recovery: the app answers again without a restart.
		const t0 = Date.now();
		let back = 0;
		while (Date.now() - t0 < 30_000 && (back = (await call('/api/me', { cookie })).status) !== 200) await sleep(250);
		const recoveryMs = Date.now() - t0;
		await sleep(2_000);
		running = false;
		await Promise.all(savers);
		console.log(`[F6] answers ${JSON.stringify(Object.fromEntries(statuses))}; /api/me while down: ${down}; back after ${recoveryMs} ms`);
		expect(down).toBe(503);
		expect(back).toBe(200);
		expect([...statuses.keys()].every((s) => s === 200 || s === 503 || s === 409)).toBe(true);
		expect(statuses.get(503) ?? 0).toBeGreaterThan(0);
		expect(bodies503.every((b) => /database is not available/i.test(b))).toBe(true);
		for (const t of targets) {
			const { specimen } = await (await call(`/api/specimens/${t.id}`, { cookie })).json();
			expect([specimen.version, specimen.title]).toEqual([t.version, t.title]);
		}
		// The photo worker recovered too: an upload after the outage is recorded.
		const meta = { filename: 'after-outage.jpg', filetype: 'image/jpeg', specimenId: targets[0]!.id, view: 'front', stage: 'as-found' };
		const { id } = await tusUpload(await sampleJpeg(800, 600), { cookie, meta });
		expect((await settled(cookie, id, 90_000)).state).toBe('recorded');
	}, 180_000);
});
