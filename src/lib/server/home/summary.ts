import { QueryTypes } from 'sequelize';
import { db } from '../db.ts';
import type { Role } from '../../auth/roles.ts';
import type { HomeSummary } from '../../home/schema.ts';

/**
 * The figures behind each role's home page, computed in SQL so they stay cheap at thousands of
 * jars; the lists themselves (my open checks, the review queue) come from /api/checks.
 */
export async function homeSummary(role: Role, userId: string, today = new Date()): Promise<HomeSummary> {
	const day = today.toISOString().slice(0, 10);
	const collection = role === 'admin' ? null : await collectionFigures(day);
	const admin = role === 'admin' ? await adminFigures() : null;
	const count = (sql: string) => db().query<{ n: string }>(sql, { type: QueryTypes.SELECT, replacements: { userId } }).then((r) => Number(r[0]?.n ?? 0));
	return {
		role,
		collection,
		openChecks: role === 'conservator' ? await count(`SELECT count(*) AS n FROM condition_checks WHERE examiner_id = :userId AND state IN ('draft','returned')`) : null,
		awaitingReview: role === 'reviewer' ? await count(`SELECT count(*) AS n FROM condition_checks WHERE state = 'in-review' AND examiner_id <> :userId`) : null,
		admin,
	};
}

async function collectionFigures(day: string): Promise<NonNullable<HomeSummary['collection']>> {
	const s = db();
	const [totals] = await s.query<{ specimens: string; overdue: string; due90: string; hazards: string }>(
		`SELECT count(*) AS specimens,
		        count(*) FILTER (WHERE next_check_due < :day) AS overdue,
		        count(*) FILTER (WHERE next_check_due >= :day AND next_check_due < (:day::date + 90)) AS due90,
		        count(*) FILTER (WHERE EXISTS (SELECT 1 FROM jsonb_array_elements(hazards) h
		                                       WHERE h->>'flag' <> 'flammable-spirit')) AS hazards
		 FROM specimens WHERE deleted_at IS NULL`,
		{ type: QueryTypes.SELECT, replacements: { day } },
	);
	const groups = (column: 'preservative_kind' | 'seal_type') =>
		s.query<{ k: string; n: string }>(
			`SELECT ${column} AS k, count(*) AS n FROM specimens WHERE deleted_at IS NULL GROUP BY 1 ORDER BY 2 DESC`,
			{ type: QueryTypes.SELECT },
		);
	const [byPreservative, bySeal, byHazard, overdue] = await Promise.all([
		groups('preservative_kind'),
		groups('seal_type'),
		s.query<{ k: string; n: string }>(
			`SELECT h->>'flag' AS k, count(*) AS n FROM specimens, jsonb_array_elements(hazards) h
			 WHERE deleted_at IS NULL GROUP BY 1 ORDER BY 2 DESC`,
			{ type: QueryTypes.SELECT },
		),
		s.query<{ id: string; object_number: string; title: string; next_check_due: string; location: string | null }>(
			`SELECT sp.id, sp.object_number, sp.title, sp.next_check_due::text AS next_check_due, l.code AS location
			 FROM specimens sp LEFT JOIN storage_locations l ON l.id = sp.storage_location_id
			 WHERE sp.deleted_at IS NULL AND sp.next_check_due < :day
			 ORDER BY sp.next_check_due ASC, sp.object_number ASC LIMIT 8`,
			{ type: QueryTypes.SELECT, replacements: { day } },
		),
	]);
	const toRecord = (rows: { k: string; n: string }[]) => Object.fromEntries(rows.map((r) => [r.k, Number(r.n)]));
	return {
		specimens: Number(totals?.specimens ?? 0),
		overdue: Number(totals?.overdue ?? 0),
		dueIn90Days: Number(totals?.due90 ?? 0),
		withHazards: Number(totals?.hazards ?? 0),
		byHazard: toRecord(byHazard),
		byPreservative: toRecord(byPreservative),
		bySeal: toRecord(bySeal),
		mostOverdue: overdue.map((r) => ({
			id: r.id,
			objectNumber: r.object_number,
			title: r.title,
			nextCheckDue: r.next_check_due,
			location: r.location,
		})),
	};
}

async function adminFigures(): Promise<NonNullable<HomeSummary['admin']>> {
	const s = db();
	const [roles, [users], [mail]] = await Promise.all([
		s.query<{ role: string; n: string }>(`SELECT role, count(*) AS n FROM users WHERE NOT disabled GROUP BY role`, {
			type: QueryTypes.SELECT,
		}),
		s.query<{ pending: string; disabled: string }>(
			`SELECT count(*) FILTER (WHERE password_hash IS NULL AND NOT disabled) AS pending,
			        count(*) FILTER (WHERE disabled) AS disabled FROM users`,
			{ type: QueryTypes.SELECT },
		),
		s.query<{ queued: string; failed: string }>(
			`SELECT count(*) FILTER (WHERE status = 'queued') AS queued, count(*) FILTER (WHERE status = 'failed') AS failed FROM outgoing_mail`,
			{ type: QueryTypes.SELECT },
		),
	]);
	return {
		usersByRole: Object.fromEntries(roles.map((r) => [r.role, Number(r.n)])),
		pendingInvitations: Number(users?.pending ?? 0),
		disabledUsers: Number(users?.disabled ?? 0),
		mailQueued: Number(mail?.queued ?? 0),
		mailFailed: Number(mail?.failed ?? 0),
	};
}
