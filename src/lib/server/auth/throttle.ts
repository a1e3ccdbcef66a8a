import { LoginThrottle } from '../models/index.ts';
import { afterFailure, waitMs, type ThrottleRule, type ThrottleState } from '../../auth/throttlePolicy.ts';

/** Sign-in throttling kept in PostgreSQL, so it holds across restarts and several app processes. */
async function load(key: string): Promise<ThrottleState | null> {
	const row = await LoginThrottle.findByPk(key);
	return row ? { failures: row.failures, windowStart: row.windowStart, blockedUntil: row.blockedUntil } : null;
}

/** The longest wait any of the keys still imposes at `now`, in ms. */
export async function currentWait(keys: [string, ThrottleRule][], now: Date): Promise<number> {
	const waits = await Promise.all(keys.map(async ([key]) => waitMs(await load(key), now)));
	return Math.max(0, ...waits);
}

export async function recordFailure(keys: [string, ThrottleRule][], now: Date): Promise<void> {
	for (const [key, rule] of keys) {
		const next = afterFailure(await load(key), now, rule);
		await LoginThrottle.upsert({ key, ...next });
	}
}

export async function clearFailures(key: string): Promise<void> {
	await LoginThrottle.destroy({ where: { key } });
}
