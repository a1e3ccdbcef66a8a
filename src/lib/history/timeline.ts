import type { CheckView } from '../check/view.ts';
import { PARTS } from '../check/vocabulary.ts';
import { mlPerMm } from '../fluid/jar.ts';
import type { DatedValue } from '../fluid/trend.ts';
import type { SpecimenView } from '../specimen/view.ts';
import { fillStartedOn, outlook, since, specimenTop, weakSpirit, type Threshold } from './outlook.ts';
import type { Series, Timeline, TimelineCheck } from './schema.ts';

/**
 * A specimen's history from its record and its checks: each check as the timeline shows it, and
 * the level, strength and yellowness series with their trends. Only approved checks that no later
 * approved check corrects are fitted; open checks are drawn so the latest visit shows, but a draft's
 * numbers are not trusted yet. Trends start at the first reading after the last top-up.
 */
/** `yellowness`: the fluid's ASTM E313 index per check id, measured on that check's front photograph (server/history). */
export function buildTimeline(s: SpecimenView, checksNewestFirst: readonly CheckView[], today: string, yellowness: ReadonlyMap<string, number> = new Map()): Timeline {
	const checks = [...checksNewestFirst].reverse();
	const correctedIds = new Set(checks.filter((c) => c.state === 'approved' && c.correctsCheckId).map((c) => c.correctsCheckId!));
	const trusted = (c: CheckView) => c.state === 'approved' && !correctedIds.has(c.id);
	const jar = { shape: s.containerShape, widthMm: s.innerWidthMm, depthMm: s.innerDepthMm, heightMm: s.innerHeightMm };
	const perMm = mlPerMm(jar);
	const rows = checks.map((c) => timelineCheck(c, correctedIds.has(c.id), yellowness.get(c.id) ?? null));

	const readings = (value: (c: TimelineCheck) => number | null) =>
		rows.flatMap((c, i) => {
			const v = value(c);
			return v === null ? [] : [{ date: c.checkedOn, value: v, checkId: c.id, approved: trusted(checks[i]!) }];
		});
	const levels = readings((c) => c.fluid?.levelMm ?? null);
	const start = fillStartedOn(levels.filter((p) => p.approved));
	const meterReadsTrue = s.preservativeKind === 'ethanol' || s.preservativeKind === 'industrial-spirit';

	const series = (points: ReturnType<typeof readings>, unit: string, threshold: Threshold | null): Series => {
		const used = since(points.filter((p) => p.approved), start);
		const o = outlook(used.map(({ date, value }): DatedValue => ({ date, value })), threshold, unit, today);
		const usedIds = new Set(used.map((p) => p.checkId));
		return {
			unit,
			points: points.map((p) => ({ ...p, used: usedIds.has(p.checkId) })),
			trend: o.trend,
			line: o.line,
			mlPerYear: null,
			threshold: threshold?.value ?? null,
			forecast: o.forecast,
		};
	};
	const level = series(levels, 'mm', specimenTop(s.specimenTopMm));
	if ('perYear' in level.trend) level.mlPerYear = level.trend.perYear * perMm;

	return {
		specimen: { id: s.id, objectNumber: s.objectNumber, title: s.title, innerHeightMm: s.innerHeightMm, specimenTopMm: s.specimenTopMm, mlPerMm: perMm },
		asOf: today,
		checks: rows,
		fillStartedOn: start,
		series: {
			level,
			strength: series(readings((c) => c.fluid?.realPercentVol ?? null), '% vol', meterReadsTrue ? weakSpirit : null),
			yellowness: series(readings((c) => c.yellowness), 'YI', null),
		},
	};
}

/** One check as the timeline shows it (a presenter over the check's own view). */
export function timelineCheck(c: CheckView, corrected: boolean, yellowness: number | null = null): TimelineCheck {
	const f = c.fluid;
	return {
		id: c.id,
		checkedOn: c.checkedOn,
		reason: c.reason,
		state: c.state,
		overallGrade: c.overallGrade,
		priority: c.priority,
		parts: Object.fromEntries(PARTS.map((p) => [p, c.parts[p]?.grade ?? null])) as TimelineCheck['parts'],
		examiner: c.examiner.name,
		fluid: f ? { levelMm: f.levelMm, realPercentVol: f.realPercentVol, tempC: f.tempC, pH: f.pH, formaldehyde: f.formaldehyde } : null,
		yellowness,
		corrected,
	};
}
