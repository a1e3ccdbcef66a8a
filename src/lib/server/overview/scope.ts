import { QueryTypes } from 'sequelize';
import { db } from '../db.ts';
import type { OverviewQuery } from '../../overview/schema.ts';

/**
 * The overview's filters as SQL conditions on a specimens alias (parameterised), and a read-only
 * query helper for the overview's modules.
 */
export function scopeSql(q: OverviewQuery, s = 's', only: { collection?: boolean; location?: boolean } = {}): string {
	const parts: string[] = [];
	if (q.collection && only.collection !== false) parts.push(`${s}.department = :collection`);
	if (q.location && only.location !== false) parts.push(`${s}.storage_location_id = :location`);
	return parts.map((p) => ` AND ${p}`).join('');
}

export function select<T extends object>(sql: string, q: OverviewQuery, extra: Record<string, unknown> = {}): Promise<T[]> {
	return db().query<T>(sql, { type: QueryTypes.SELECT, replacements: { collection: q.collection ?? null, location: q.location ?? null, ...extra } });
}

/** The latest level reading of a trusted check of specimen `s`, as a LATERAL subquery (alias lv). */
export const latestLevelSql = (s: string, trusted: string) => `LEFT JOIN LATERAL (
	SELECT (c.fluid->>'levelMm')::float8 AS level, (c.fluid->>'tempC')::float8 AS temp_c, (c.fluid->>'realPercentVol')::float8 AS real, c.checked_on::text AS checked_on
	FROM condition_checks c
	WHERE c.specimen_id = ${s}.id AND ${trusted} AND c.fluid->>'levelMm' IS NOT NULL
	ORDER BY c.checked_on DESC, c.reviewed_at DESC LIMIT 1) lv ON true`;
