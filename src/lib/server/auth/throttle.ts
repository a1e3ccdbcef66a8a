import { Transaction } from 'sequelize';
import { LoginThrottle } from '../models/index.ts';
import { db } from '../db.ts';
import { afterFailure, afterRefund, waitMs, type ThrottleRule, type ThrottleState } from '../../auth/throttlePolicy.ts';

/**
 * Sign-in throttling kept in PostgreSQL, so it holds across restarts and several app processes.
 *
 * An attempt is charged BEFORE its password is checked, with the counters locked, and refunded if it
 * succeeds. Checking first and counting after the (slow) password check would let a flood of parallel
 * guesses all pass the check before any was counted: measured, 20 guesses at a time got 20 password
 * checks through an allowance of 5 (tests/reliability/loginFlood.test.ts).
 */
const stateOf = (row: LoginThrottle): ThrottleState | null =>
	row.failures > 0 ? { failures: row.failures, windowStart: row.windowStart, blockedUntil: row.blockedUntil } : null;

async function locked(key: string, now: Date, transaction: Transaction): Promise<LoginThrottle> {
	// INSERT … ON CONFLICT DO NOTHING: the row exists afterwards, whoever made it; then lock it.
	await LoginThrottle.bulkCreate([{ key, failures: 0, windowStart: now, blockedUntil: null }], { ignoreDuplicates: true, transaction });
	return (await LoginThrottle.findByPk(key, { transaction, lock: Transaction.LOCK.UPDATE }))!;
}

/**
 * Charges one attempt to every key, or none when one of them still imposes a wait. Answers the wait
 * in ms (0: charged, go ahead and check the password). Keys are locked in a fixed order, so two
 * attempts sharing keys cannot deadlock.
 */
export async function reserveAttempt(keys: [string, ThrottleRule][], now: Date): Promise<number> {
	const sorted = [...keys].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
	return db().transaction(async (transaction) => {
		const rows = [];
		for (const [key, rule] of sorted) rows.push({ row: await locked(key, now, transaction), rule });
		const wait = Math.max(0, ...rows.map(({ row }) => waitMs(stateOf(row), now)));
		if (wait > 0) return wait;
		for (const { row, rule } of rows) await row.update(afterFailure(stateOf(row), now, rule), { transaction });
		return 0;
	});
}

/** A successful sign-in: the first key (the account's or the browser's) is cleared, the others refunded. */
export async function settleSuccess(keys: [string, ThrottleRule][], now: Date): Promise<void> {
	const [first, ...rest] = keys;
	if (first) await LoginThrottle.destroy({ where: { key: first[0] } });
	for (const [key, rule] of rest) {
		await db().transaction(async (transaction) => {
			const row = await locked(key, now, transaction);
			const state = stateOf(row);
			if (state) await row.update(afterRefund(state, rule), { transaction });
		});
	}
}
