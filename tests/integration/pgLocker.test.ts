import crypto from 'node:crypto';
import pg from 'pg';
import { ERRORS } from '@tus/server';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { freePort } from '../../db/cluster.mjs';
import { isDatabaseUnavailable } from '../../src/lib/server/dbErrors.ts';
import { lockKey, PgLocker } from '../../src/lib/server/photos/pgLocker.ts';
import { lockHolders } from '../helpers/locks.ts';
import { useTestDatabase } from '../helpers/server.ts';

/**
 * The tus locker held in PostgreSQL (TESTPLAN F4, tus-node-server #408), against the real test
 * database: two PgLockers with their own pools and LISTEN connections stand for two app processes.
 * The behaviour asked for is @tus/server 2.4.5's MemoryLocker (lockers/MemoryLocker.js): a request
 * for a held lock calls the holder's requestRelease and keeps trying until it gets the lock or its
 * acquire timeout passes, then throws ERRORS.ERR_LOCK_TIMEOUT; unlocking a lock not held throws.
 * Advisory locks: PostgreSQL docs §13.3.5 (session-level locks are released when the session ends).
 */
let admin: pg.Client;
const made: PgLocker[] = [];
const logs: string[] = [];
let n = 0;

function locker(o: { acquireLockTimeout?: number; connectionString?: string } = {}): { locker: PgLocker; app: string } {
	const app = `f4-locker-${process.pid}-${n++}`;
	const l = new PgLocker({ connectionString: inject('databaseUrl'), applicationName: app, log: (m) => logs.push(`${app}: ${m}`), ...o });
	made.push(l);
	return { locker: l, app };
}

const never = () => new AbortController().signal;

/**
 * A lock taken on `l` that counts the release requests it gets; with `letGo` it unlocks at the first,
 * as tus's holder does once its request has stopped.
 */
async function hold(l: PgLocker, id: string, letGo = false) {
	const lock = l.newLock(id);
	const seen = { asked: 0 };
	await lock.lock(never(), () => {
		if (seen.asked++ === 0 && letGo) void lock.unlock();
	});
	return { lock, seen };
}
const uploadId = () => crypto.randomBytes(16).toString('hex');
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

beforeAll(async () => {
	useTestDatabase();
	admin = new pg.Client({ connectionString: inject('databaseUrl') });
	admin.on('error', () => {});
	await admin.connect();
});

afterAll(async () => {
	await Promise.all(made.map((l) => l.close()));
	await admin?.end();
});

describe('lock keys', () => {
	it('are 64-bit, stable for an upload and different between uploads', () => {
		const id = uploadId();
		expect(lockKey(id)).toBe(lockKey(id));
		expect(lockKey(id)).not.toBe(lockKey(uploadId()));
		const k = BigInt(lockKey(id));
		expect(k >= -(2n ** 63n) && k < 2n ** 63n).toBe(true);
	});
});

describe('PgLocker, two instances on one database', () => {
	it('takes a free lock at once in PostgreSQL, keeps uploads apart, and lets it go on unlock', async () => {
		const a = locker();
		const b = locker();
		const [one, two] = [uploadId(), uploadId()];
		const la = a.locker.newLock(one);
		await la.lock(never(), () => {});
		expect(await lockHolders(one)).toEqual([a.app]);
		// Another upload on the other instance is not held up.
		const lb = b.locker.newLock(two);
		await lb.lock(never(), () => {});
		expect(await lockHolders(two)).toEqual([b.app]);
		await Promise.all([la.unlock(), lb.unlock()]);
		expect(await lockHolders(one)).toEqual([]);
		expect(await lockHolders(two)).toEqual([]);
	});

	it('asks the holder on the other instance to let go, and takes the lock once it is released', async () => {
		const a = locker();
		const b = locker();
		const id = uploadId();
		const { seen } = await hold(a.locker, id, true);
		const t0 = Date.now();
		await b.locker.newLock(id).lock(never(), () => {});
		console.log(`[F4 locker] lock handed over between instances in ${Date.now() - t0} ms`);
		// Only NOTIFY reaches instance A: the two lockers share nothing but the database.
		expect(seen.asked).toBeGreaterThanOrEqual(1);
		expect(await lockHolders(id)).toEqual([b.app]);
	});

	it('excludes a second request in the same instance as well', async () => {
		const a = locker();
		const id = uploadId();
		const { lock: first, seen } = await hold(a.locker, id);
		let second = false;
		const waiting = a.locker
			.newLock(id)
			.lock(never(), () => {})
			.then(() => (second = true));
		await sleep(400);
		expect(second).toBe(false);
		expect(seen.asked).toBeGreaterThanOrEqual(1);
		await first.unlock();
		await waiting;
		expect(second).toBe(true);
	});

	it('gives up with tus’s ERR_LOCK_TIMEOUT after the acquire timeout when the holder does not let go', async () => {
		const a = locker();
		const b = locker({ acquireLockTimeout: 800 });
		const id = uploadId();
		const { seen } = await hold(a.locker, id);
		const t0 = Date.now();
		await expect(b.locker.newLock(id).lock(never(), () => {})).rejects.toBe(ERRORS.ERR_LOCK_TIMEOUT);
		const waited = Date.now() - t0;
		expect(waited).toBeGreaterThanOrEqual(800);
		// It kept asking while it waited (MemoryLocker asks on every try).
		expect(seen.asked).toBeGreaterThanOrEqual(2);
		expect(await lockHolders(id)).toEqual([a.app]);
	});

	it('stops waiting when the request is stopped, and leaves nothing held', async () => {
		const a = locker();
		const b = locker();
		const id = uploadId();
		const { lock: la } = await hold(a.locker, id);
		const stop = new AbortController();
		const t0 = Date.now();
		const waiting = b.locker.newLock(id).lock(stop.signal, () => {});
		setTimeout(() => stop.abort(), 300);
		await expect(waiting).rejects.toBe(ERRORS.ERR_LOCK_TIMEOUT);
		expect(Date.now() - t0).toBeLessThan(b.locker.timeout);
		await la.unlock();
		expect(await lockHolders(id)).toEqual([]);
		await b.locker.newLock(id).lock(never(), () => {});
		expect(await lockHolders(id)).toEqual([b.app]);
	});

	it('refuses to unlock a lock it does not hold, as MemoryLocker does', async () => {
		await expect(locker().locker.newLock(uploadId()).unlock()).rejects.toThrow(/unlocked lock/);
	});

	it('loses a lock whose connection is cut, asks its request to stop, and lets the other instance take it', async () => {
		const a = locker();
		const b = locker();
		const id = uploadId();
		const { lock: la, seen } = await hold(a.locker, id);
		// What a database restart does to the connection (and what a killed process's exit does).
		await admin.query(
			`SELECT pg_terminate_backend(l.pid) FROM pg_locks l JOIN pg_stat_activity s ON s.pid = l.pid WHERE l.locktype = 'advisory' AND s.application_name = $1`,
			[a.app],
		);
		await expect.poll(() => seen.asked, { timeout: 10_000 }).toBeGreaterThanOrEqual(1);
		await b.locker.newLock(id).lock(never(), () => {});
		expect(await lockHolders(id)).toEqual([b.app]);
		// Unlocking the lost lock neither throws nor touches the new holder's.
		await la.unlock();
		expect(await lockHolders(id)).toEqual([b.app]);
	});

	it('listens again after its LISTEN connection is cut, so release requests still reach it', async () => {
		const a = locker();
		const b = locker();
		const id = uploadId();
		const { seen } = await hold(a.locker, id, true);
		const pid = await a.locker.listenerPid();
		expect(pid).toBeGreaterThan(0);
		await admin.query('SELECT pg_terminate_backend($1)', [pid]);
		await expect.poll(async () => (await a.locker.listenerPid()) ?? pid, { timeout: 15_000, interval: 100 }).not.toBe(pid);
		await b.locker.newLock(id).lock(never(), () => {});
		expect(seen.asked).toBeGreaterThanOrEqual(1);
		expect(logs.some((l) => l.startsWith(a.app) && /notifications lost/.test(l))).toBe(true);
		expect(logs.some((l) => l.startsWith(a.app) && /notifications back/.test(l))).toBe(true);
	}, 30_000);

	it('fails a lock with an error the app answers with 503 when the database cannot be reached', async () => {
		const port = await freePort();
		const down = locker({ connectionString: `postgres://nobody@127.0.0.1:${port}/none` });
		const err = await down.locker
			.newLock(uploadId())
			.lock(never(), () => {})
			.catch((e: unknown) => e);
		expect(err).toBeInstanceOf(Error);
		// src/lib/server/dbErrors.ts: a connection refused is the database being away, not a fault.
		expect(isDatabaseUnavailable(err)).toBe(true);
	});
});
