import crypto from 'node:crypto';
import pg from 'pg';
import { ERRORS, type Lock, type Locker, type RequestRelease } from '@tus/server';

/**
 * tus upload locks held in PostgreSQL, so that several app processes may serve one site (behind a
 * round-robin proxy, or restarted side by side) without two of them writing the same upload at once.
 * @tus/server's default MemoryLocker only knows the requests of its own process (tus-node-server
 * issue #408): two processes could each take "the" lock of one upload and interleave their bytes.
 *
 * A lock is a session-level advisory lock (PostgreSQL docs §13.3.5, "Advisory Locks") on a 64-bit
 * key derived from the upload id, taken with pg_try_advisory_lock on a connection of this locker's
 * own small pool and kept on that connection until unlock. Session locks belong to the connection,
 * not to a transaction: a process that crashes or is killed loses its connections and PostgreSQL
 * releases their locks with them, so a dead instance never leaves an upload locked.
 *
 * As MemoryLocker does within one process, a request that finds the upload locked asks the holder to
 * let go (tus then stops the holder's request after lockDrainTimeout) and tries again until it gets
 * the lock or its acquire timeout passes (the same 30 s default, then the same ERR_LOCK_TIMEOUT). The
 * request reaches a holder in another process by NOTIFY on one channel that every locker LISTENs to
 * on a connection of its own, re-established after the database restarts; an unlock NOTIFYs too, so
 * waiters try again at once rather than at their next poll.
 */
export const LOCK_CHANNEL = 'meniscus_tus_locks';

/** MemoryLocker's default acquire timeout (@tus/server 2.4.5, lockers/MemoryLocker.js). */
const DEFAULT_ACQUIRE_TIMEOUT_MS = 30_000;
/** A waiter tries again this often even without a notification (one missed, or a holder that died). */
const RETRY_MS = 100;
/** Between attempts to LISTEN again once the connection is gone. */
const RELISTEN_MS = 1_000;

export interface PgLockerOptions {
	connectionString: string;
	acquireLockTimeout?: number;
	/**
	 * Connections for held locks (one each, plus one per request waiting for a lock). A full pool makes
	 * a request wait up to `connectTimeout`, then fail as an unreachable database does: 503, try again.
	 */
	maxLocks?: number;
	connectTimeout?: number;
	/** Shown in pg_stat_activity; the tests use it to find (and cut) their own connections. */
	applicationName?: string;
	log?: (message: string) => void;
}

/**
 * The advisory lock key of an upload: the first 64 bits of SHA-256 over a namespaced name, as a signed
 * bigint in decimal (pg's bigint parameter). The namespace keeps it apart from other advisory locks in
 * the same database (pg-boss takes some); a collision of two uploads' keys would only make them wait
 * for each other.
 */
export function lockKey(uploadId: string): string {
	return crypto.createHash('sha256').update(`meniscus:tus-upload:${uploadId}`).digest().readBigInt64BE(0).toString();
}

interface Held {
	requestRelease: RequestRelease;
}

export class PgLocker implements Locker {
	readonly timeout: number;
	private readonly pool: pg.Pool;
	readonly log: (message: string) => void;
	private listener: pg.Client | undefined;
	private listening: Promise<void> | undefined;
	private relistenTimer: NodeJS.Timeout | undefined;
	private listenLost = false;
	private closed = false;
	/** Locks this process holds, by key: a release request for one of them reaches its request. */
	readonly held = new Map<string, Held>();
	/** Requests waiting for a key, woken by an unlock here or a "released" notification. */
	private readonly waiters = new Map<string, Set<() => void>>();
	/** Connections checked out for locks: close() ends them (pool.end() would wait for them). */
	private readonly out = new Set<() => void>();

	constructor(private readonly options: PgLockerOptions) {
		this.timeout = options.acquireLockTimeout ?? DEFAULT_ACQUIRE_TIMEOUT_MS;
		this.log = options.log ?? ((m) => console.error(`[uploads] ${m}`));
		this.pool = new pg.Pool({
			connectionString: options.connectionString,
			max: options.maxLocks ?? 16,
			connectionTimeoutMillis: options.connectTimeout ?? 10_000,
			idleTimeoutMillis: 30_000,
			application_name: options.applicationName ?? 'meniscus tus locks',
		});
		// An idle connection whose server went away emits 'error' on the pool; unheard it would end the
		// process (db.ts). The pool drops it and opens another when asked.
		this.pool.on('error', (err) => this.log(`idle lock connection lost: ${err.message}`));
	}

	newLock(id: string): Lock {
		return new PgLock(this, lockKey(id));
	}

	/** A connection for one lock, with an 'error' listener of its own while it is checked out. */
	async connect(onLost: (err: Error) => void): Promise<{ client: pg.PoolClient; done: (destroy: boolean) => void }> {
		this.ensureListening();
		const client = await this.pool.connect();
		const lost = (err: Error) => onLost(err);
		client.on('error', lost);
		let released = false;
		const done = (destroy: boolean) => {
			if (released) return;
			released = true;
			this.out.delete(end);
			client.removeListener('error', lost);
			// A destroyed connection ends its session, and with it any lock it still held.
			client.release(destroy || undefined);
		};
		const end = () => done(true);
		this.out.add(end);
		return { client, done };
	}

	/** Asks whoever holds `key` to let go: a holder in this process directly, others by NOTIFY. */
	async askRelease(client: pg.PoolClient, key: string): Promise<void> {
		await this.held.get(key)?.requestRelease();
		await client.query('SELECT pg_notify($1, $2)', [LOCK_CHANNEL, `release:${key}`]);
	}

	/** Resolves when `key` may be free: notified, polled, given up on, or the request stopped. */
	waitForRelease(key: string, ms: number, stop: AbortSignal): Promise<void> {
		return new Promise((resolve) => {
			const set = this.waiters.get(key) ?? new Set();
			this.waiters.set(key, set);
			const finish = () => {
				clearTimeout(timer);
				stop.removeEventListener('abort', finish);
				set.delete(finish);
				if (set.size === 0 && this.waiters.get(key) === set) this.waiters.delete(key);
				resolve();
			};
			const timer = setTimeout(finish, ms);
			stop.addEventListener('abort', finish, { once: true });
			set.add(finish);
		});
	}

	wake(key: string): void {
		for (const w of [...(this.waiters.get(key) ?? [])]) w();
	}

	private onNotification(payload: string | undefined): void {
		const [kind, key] = (payload ?? '').split(':');
		if (!key) return;
		if (kind === 'release') {
			const holder = this.held.get(key);
			if (holder) Promise.resolve(holder.requestRelease()).catch((err) => this.log(`release request failed: ${err.message}`));
		} else if (kind === 'released') this.wake(key);
	}

	/** Starts (or, after a lost connection, restarts) the LISTEN connection; never throws. */
	ensureListening(): void {
		if (this.closed || this.listener || this.listening || this.relistenTimer) return;
		this.listening = this.listen().finally(() => (this.listening = undefined));
	}

	private async listen(): Promise<void> {
		const client = new pg.Client({ connectionString: this.options.connectionString, application_name: this.options.applicationName ?? 'meniscus tus locks' });
		const lost = (why: string) => {
			if (this.closed || (this.listener !== client && this.listener !== undefined)) return;
			if (!this.listenLost) this.log(`lock notifications lost (${why}); listening again when the database answers`);
			this.listenLost = true;
			this.listener = undefined;
			client.end().catch(() => {});
			this.scheduleRelisten();
		};
		// An unhandled 'error' on a pg client ends the process; a restart of the database is one.
		client.on('error', (err) => lost(err.message));
		client.on('end', () => lost('connection ended'));
		client.on('notification', (msg) => {
			if (msg.channel === LOCK_CHANNEL) this.onNotification(msg.payload);
		});
		try {
			await client.connect();
			await client.query(`LISTEN ${LOCK_CHANNEL}`);
			if (this.closed) {
				await client.end();
				return;
			}
			this.listener = client;
			if (this.listenLost) this.log('lock notifications back');
			this.listenLost = false;
		} catch (err) {
			lost((err as Error).message);
		}
	}

	private scheduleRelisten(): void {
		if (this.closed || this.relistenTimer) return;
		this.relistenTimer = setTimeout(() => {
			this.relistenTimer = undefined;
			this.ensureListening();
		}, RELISTEN_MS);
		this.relistenTimer.unref();
	}

	/** The LISTEN connection's backend pid, once listening (for tests). */
	async listenerPid(): Promise<number | undefined> {
		await this.listening;
		return (this.listener as (pg.Client & { processID?: number }) | undefined)?.processID;
	}

	/** Ends the LISTEN connection and the pool; locks still held are released with their connections. */
	async close(): Promise<void> {
		this.closed = true;
		clearTimeout(this.relistenTimer);
		await this.listening;
		const listener = this.listener;
		this.listener = undefined;
		for (const end of [...this.out]) end();
		await Promise.all([listener?.end().catch(() => {}), this.pool.end()]);
	}
}

class PgLock implements Lock {
	private conn: { client: pg.PoolClient; done: (destroy: boolean) => void } | undefined;
	private lost: Error | undefined;

	constructor(
		private readonly locker: PgLocker,
		readonly key: string,
	) {}

	async lock(stopSignal: AbortSignal, requestRelease: RequestRelease): Promise<void> {
		if (this.conn) throw new Error('This lock is already held.');
		const deadline = Date.now() + this.locker.timeout;
		const conn = await this.locker.connect((err) => this.onLost(err, requestRelease));
		try {
			while (!stopSignal.aborted && !this.lost) {
				const { rows } = await conn.client.query<{ ok: boolean }>('SELECT pg_try_advisory_lock($1::bigint) AS ok', [this.key]);
				if (rows[0]?.ok) {
					this.conn = conn;
					this.locker.held.set(this.key, { requestRelease });
					return;
				}
				if (Date.now() >= deadline) break;
				await this.locker.askRelease(conn.client, this.key);
				await this.locker.waitForRelease(this.key, Math.min(RETRY_MS, Math.max(0, deadline - Date.now())), stopSignal);
			}
		} catch (err) {
			// The connection (or the database) failed: the caller answers 503 (dbErrors.ts).
			conn.done(true);
			throw err;
		}
		conn.done(this.lost !== undefined);
		// The connection went while waiting: the database is away (503), as when a query fails.
		if (this.lost) throw this.lost;
		// As MemoryLocker: a request stopped while waiting, or a wait that ran out, is a lock timeout.
		throw ERRORS.ERR_LOCK_TIMEOUT;
	}

	/**
	 * The connection of a held lock is gone (the database restarted, or the connection was cut): the
	 * lock went with it, so the request holding it is asked to stop, as it would be for another request.
	 * Its bytes so far stay valid (tus writes in order; a later PATCH starts from the offset on disk).
	 */
	private onLost(err: Error, requestRelease: RequestRelease): void {
		if (this.lost) return;
		this.lost = err;
		if (this.conn) {
			this.locker.log(`the lock connection of an upload was lost (${err.message}); stopping its request`);
			Promise.resolve(requestRelease()).catch(() => {});
		}
	}

	async unlock(): Promise<void> {
		const conn = this.conn;
		if (!conn) throw new Error('Releasing an unlocked lock!');
		this.conn = undefined;
		this.locker.held.delete(this.key);
		let destroy = this.lost !== undefined;
		if (!this.lost) {
			try {
				await conn.client.query('SELECT pg_advisory_unlock($1::bigint), pg_notify($2, $3)', [this.key, LOCK_CHANNEL, `released:${this.key}`]);
			} catch {
				// Closing the connection releases the lock just as well; the request's own answer stands.
				destroy = true;
			}
		}
		conn.done(destroy);
		this.locker.wake(this.key);
	}
}
