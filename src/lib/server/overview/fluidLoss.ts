import { mlPerMm, type JarShape } from '../../fluid/jar.ts';
import type { DatedValue } from '../../fluid/trend.ts';
import { levelOutlook, TOP_UP_RISE_MM } from '../../history/outlook.ts';
import { LOSS_LIST_LENGTH, type LossRow, type Overview, type OverviewQuery } from '../../overview/schema.ts';
import { scopeSql, select } from './scope.ts';
import { trustedCheckSql } from './sql.ts';

/**
 * The jars losing fluid fastest, and those nearest to exposing their specimen. SQL fits a
 * least-squares line to each jar's levels since its last top-up (regr_slope over the trusted
 * checks, read once) only to choose candidates: the CANDIDATES steepest, and the CANDIDATES with the
 * least time left. Each candidate is then judged by the same trend and forecast functions the
 * specimen's history uses (levelOutlook), which decide what is shown; so JavaScript does at most
 * 2 × CANDIDATES small fits whatever the size of the collection.
 */
export const CANDIDATES = 60;

type Candidate = {
	id: string;
	object_number: string;
	title: string;
	location: string | null;
	shape: JarShape;
	w: number;
	d: number | null;
	h: number;
	top: number | null;
	points: DatedValue[];
};

export async function fluidLoss(q: OverviewQuery, today: string): Promise<Overview['fluidLoss']> {
	const rows = await select<Candidate & { considered: string }>(
		`WITH r AS MATERIALIZED (
		   SELECT c.specimen_id, c.checked_on, (c.fluid->>'levelMm')::float8 AS lvl, c.checked_on - DATE '2000-01-01' AS x
		   FROM condition_checks c JOIN specimens s ON s.id = c.specimen_id
		   WHERE s.deleted_at IS NULL${scopeSql(q)} AND ${trustedCheckSql('c')} AND c.fluid->>'levelMm' IS NOT NULL
		 ), fills AS (
		   -- The current fill starts at the last reading that rose more than a top-up's worth (fillStartedOn).
		   SELECT specimen_id, max(checked_on) FILTER (WHERE rise > :rise) AS since
		   FROM (SELECT specimen_id, checked_on, lvl - lag(lvl) OVER (PARTITION BY specimen_id ORDER BY checked_on) AS rise FROM r) d
		   GROUP BY specimen_id
		 ), fit AS (
		   SELECT r.specimen_id, f.since, count(*) AS n, regr_slope(lvl, x) AS slope,
		          regr_intercept(lvl, x) + regr_slope(lvl, x) * max(x) AS fitted_last,
		          (array_agg(lvl ORDER BY r.checked_on DESC))[1] AS last_lvl
		   FROM r JOIN fills f ON f.specimen_id = r.specimen_id
		   WHERE f.since IS NULL OR r.checked_on >= f.since
		   GROUP BY r.specimen_id, f.since
		 ), cand AS (
		   SELECT fit.*, s.object_number, s.title, l.code AS location, s.container_shape AS shape, s.inner_width_mm::float8 AS w,
		          s.inner_depth_mm::float8 AS d, s.inner_height_mm::float8 AS h, s.specimen_top_mm::float8 AS top,
		          CASE WHEN n >= 3 AND slope < 0 THEN slope END AS falling,
		          CASE WHEN s.specimen_top_mm IS NULL THEN NULL
		               WHEN last_lvl <= s.specimen_top_mm THEN -1
		               WHEN n >= 3 AND slope < 0 THEN (fitted_last - s.specimen_top_mm) / -slope END AS days_left
		   FROM fit JOIN specimens s ON s.id = fit.specimen_id LEFT JOIN storage_locations l ON l.id = s.storage_location_id
		   WHERE (n >= 3 AND slope < 0) OR last_lvl <= s.specimen_top_mm
		 ), ranked AS (
		   SELECT cand.*, row_number() OVER (ORDER BY falling ASC NULLS LAST, object_number) AS by_rate,
		          row_number() OVER (ORDER BY days_left ASC NULLS LAST, object_number) AS by_left,
		          count(*) OVER () AS considered
		   FROM cand
		 )
		 SELECT p.specimen_id AS id, p.object_number, p.title, p.location, p.shape, p.w, p.d, p.h, p.top, p.considered,
		        json_agg(json_build_object('date', r.checked_on::text, 'value', r.lvl) ORDER BY r.checked_on) AS points
		 FROM (SELECT * FROM ranked WHERE (by_rate <= :k AND falling IS NOT NULL) OR (by_left <= :k AND days_left IS NOT NULL)) p
		 JOIN r ON r.specimen_id = p.specimen_id AND (p.since IS NULL OR r.checked_on >= p.since)
		 GROUP BY p.specimen_id, p.object_number, p.title, p.location, p.shape, p.w, p.d, p.h, p.top, p.considered`,
		q,
		{ rise: TOP_UP_RISE_MM, k: CANDIDATES },
	);
	const judged = rows.map((r) => {
		const o = levelOutlook(r.points, { specimenTopMm: r.top, today });
		const perYearMm = o.trend.kind === 'trend' ? o.trend.perYear : null;
		const latest = r.points.at(-1)!;
		const row: LossRow = {
			id: r.id,
			objectNumber: r.object_number,
			title: r.title,
			location: r.location,
			latestLevelMm: latest.value,
			latestOn: latest.date,
			perYearMm,
			perYearMl: perYearMm === null ? null : perYearMm * mlPerMm({ shape: r.shape, widthMm: r.w, depthMm: r.d, heightMm: r.h }),
			specimenTopMm: r.top,
			forecast: o.forecast,
		};
		return row;
	});
	const left = (r: LossRow) => (r.forecast.kind === 'at-or-below' ? -Infinity : r.forecast.kind === 'date' ? r.forecast.monthsFromToday : Infinity);
	return {
		byRate: judged
			.filter((r) => r.perYearMm !== null && r.perYearMm < 0)
			.sort((a, b) => a.perYearMm! - b.perYearMm! || a.objectNumber.localeCompare(b.objectNumber))
			.slice(0, LOSS_LIST_LENGTH),
		byTimeLeft: judged
			.filter((r) => left(r) !== Infinity)
			.sort((a, b) => (left(a) === left(b) ? a.objectNumber.localeCompare(b.objectNumber) : left(a) - left(b)))
			.slice(0, LOSS_LIST_LENGTH),
		considered: Number(rows[0]?.considered ?? 0),
	};
}
