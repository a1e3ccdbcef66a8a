import { QueryTypes } from 'sequelize';
import { db } from '../../src/lib/server/db.ts';
import { lockKey } from '../../src/lib/server/photos/pgLocker.ts';

/**
 * The backends (by application_name) holding the tus lock of an upload, read from pg_locks, which
 * shows a bigint advisory key as classid (high 32 bits) and objid (low 32 bits) with objsubid 1
 * (PostgreSQL docs, "pg_locks"). Call useTestDatabase() first.
 */
export async function lockHolders(uploadId: string): Promise<string[]> {
	const key = BigInt.asUintN(64, BigInt(lockKey(uploadId)));
	const rows = await db().query<{ app: string }>(
		`SELECT a.application_name AS app FROM pg_locks l JOIN pg_stat_activity a ON a.pid = l.pid
		 WHERE l.locktype = 'advisory' AND l.granted AND l.objsubid = 1 AND l.classid = $1::oid AND l.objid = $2::oid`,
		{ bind: [String(key >> 32n), String(key & 0xffffffffn)], type: QueryTypes.SELECT },
	);
	return rows.map((r) => r.app);
}
