import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { useTestDatabase } from '../helpers/server.ts';
import { signedInUser } from '../helpers/users.ts';
import { expectAcknowledgedKept, saveTargets, startSavers, type SaveTarget } from '../helpers/savers.ts';
import { db } from '../../src/lib/server/db.ts';
import { freePort } from '../../db/cluster.mjs';
import { stopService, type Service } from '../../scripts/lib/proc.mjs';
import { startApp } from '../helpers/apps.ts';

/**
 * TESTPLAN F1 for saves (the PATCH half is in tests/integration/photoResume.test.ts): an app
 * process of our own, on the same database, is killed with SIGKILL while people save records, and
 * started again. Pass: no partial rows (every committed version of a record has exactly its one
 * audit event, written in the same transaction: ASVS 5.0 2.3.3); every acknowledged save reads back;
 * a save whose answer was lost either committed whole or not at all; the savers carry on once it is
 * back.
 */
let app: Service | undefined;
let base = '';
let cookie = '';
let targets: SaveTarget[] = [];

beforeAll(async () => {
	useTestDatabase();
	const port = await freePort();
	base = `http://127.0.0.1:${port}`;
	app = await startApp('app-kill', port);
	({ cookie } = await signedInUser('conservator', 'kill'));
	targets = await saveTargets(cookie, `KL${process.pid}`, 4, base);
}, 120_000);

afterAll(async () => {
	await stopService(app);
});

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe('the app killed with SIGKILL mid-save (TESTPLAN F1)', () => {
	it('loses no acknowledged save and leaves no partial change', async () => {
		const savers = startSavers({ cookie, targets, base, retry: [0] });
		const port = Number(new URL(base).port);
		for (let round = 0; round < 3; round++) {
			await sleep(800);
			app!.kill('SIGKILL');
			await app!.exited;
			await sleep(300);
			app = await startApp('app-kill', port);
		}
		await sleep(1_000);
		await savers.stop();
		console.log(`[F1 saves] answers ${JSON.stringify(Object.fromEntries(savers.statuses))} over 3 kills`);
		// The kills cut requests off (status 0), and saving went on between them.
		expect(savers.statuses.get(0) ?? 0).toBeGreaterThan(0);
		expect(savers.statuses.get(200) ?? 0).toBeGreaterThan(10);
		await expectAcknowledgedKept(cookie, targets);
		// Each committed version has its audit event, and only committed versions have one.
		const rows = await db().query<{ id: string; version: number; events: number }>(
			`SELECT s.id, s.version, (SELECT count(*)::int FROM audit_events a WHERE a.entity_id = s.id::text AND a.action = 'specimen.update') AS events
			 FROM specimens s WHERE s.id IN (:ids)`,
			{ replacements: { ids: targets.map((t) => t.id) }, type: QueryTypes.SELECT },
		);
		for (const t of targets) {
			const r = rows.find((x) => x.id === t.id)!;
			expect(r.events).toBe(r.version - t.first);
		}
	}, 180_000);
});
