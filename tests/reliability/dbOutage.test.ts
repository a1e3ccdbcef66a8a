import { beforeAll, describe, expect, inject, it } from 'vitest';
import { call, useTestDatabase } from '../helpers/server.ts';
import { signedInUser } from '../helpers/users.ts';
import { sampleJpeg, settled, tusUpload } from '../helpers/photos.ts';
import { expectAcknowledgedKept, saveTargets, startSavers, type SaveTarget } from '../helpers/savers.ts';
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
let cookie = '';
let targets: SaveTarget[] = [];

beforeAll(async () => {
	useTestDatabase();
	({ cookie } = await signedInUser('conservator', 'outage'));
	targets = await saveTargets(cookie, `DB${process.pid}`, 4);
});

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe('PostgreSQL stopping mid-request (TESTPLAN F6)', () => {
	it('answers 503 while it is down, recovers by itself, and keeps every acknowledged save', async () => {
		const savers = startSavers({ cookie, targets, retry: [503] });
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
		await savers.stop();
		console.log(`[F6] answers ${JSON.stringify(Object.fromEntries(savers.statuses))}; /api/me while down: ${down}; back after ${recoveryMs} ms`);
		expect(down).toBe(503);
		expect(back).toBe(200);
		expect(savers.statuses.get(503) ?? 0).toBeGreaterThan(0);
		expect(savers.refusals.every((b) => /database is not available/i.test(b))).toBe(true);
		await expectAcknowledgedKept(cookie, targets);
		// The photo worker recovered too: an upload after the outage is recorded.
		const meta = { filename: 'after-outage.jpg', filetype: 'image/jpeg', specimenId: targets[0]!.id, view: 'front', stage: 'as-found' };
		const { id } = await tusUpload(await sampleJpeg(800, 600), { cookie, meta });
		expect((await settled(cookie, id, 90_000)).state).toBe('recorded');
	}, 180_000);
});
