import PgBoss from 'pg-boss';
import { config } from '../config.ts';

/**
 * The photo job queue, on PostgreSQL through pg-boss, so a job survives restarts of the app and the
 * worker and can be taken by a worker on another machine. The app only sends; the worker
 * (scripts/worker.ts) works. pg-boss keeps its own tables in the `pgboss` schema and upgrades them
 * itself under an advisory lock.
 */
export const INGEST_QUEUE = 'photo-ingest';

export interface IngestJob {
	uploadId: string;
}

/** Retries with back-off (pg-boss doubles the delay each time): a database or disk hiccup heals. */
export const INGEST_RETRY = { retryLimit: 8, retryDelay: 5, retryBackoff: true, expireInMinutes: 30 } as const;

let boss: Promise<PgBoss> | undefined;

export function queue(role: 'sender' | 'worker' = 'sender'): Promise<PgBoss> {
	boss ??= (async () => {
		const b = new PgBoss({
			connectionString: config().DATABASE_URL,
			max: role === 'worker' ? 4 : 2,
			application_name: `meniscus-${role}`,
			// Maintenance and schedules run in the worker only.
			supervise: role === 'worker',
			schedule: role === 'worker',
		});
		b.on('error', (err) => console.error(`[queue] ${err.message}`));
		await b.start();
		await b.createQueue(INGEST_QUEUE, { name: INGEST_QUEUE, policy: 'standard', ...INGEST_RETRY });
		return b;
	})().catch((err) => {
		boss = undefined;
		throw err;
	});
	return boss;
}

export async function enqueueIngest(uploadId: string): Promise<void> {
	const b = await queue();
	await b.send(INGEST_QUEUE, { uploadId } satisfies IngestJob, { singletonKey: uploadId, ...INGEST_RETRY });
}

export async function stopQueue(): Promise<void> {
	const b = await boss?.catch(() => undefined);
	boss = undefined;
	await b?.stop({ graceful: true, timeout: 10_000 });
}
