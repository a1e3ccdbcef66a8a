import { GRADES, type Grade, type Priority } from './vocabulary.ts';

/**
 * Grades, priority and the next check. Documentation practice: the overall condition is the most
 * serious individual condition found (TRADE.md [S44c]); overriding it needs a written reason.
 */
export const gradeRank = (g: Grade): number => GRADES.indexOf(g);

/** The worst of the part grades given; null when no part has been graded yet. */
export function worstGrade(parts: readonly (Grade | null | undefined)[]): Grade | null {
	const given = parts.filter((g): g is Grade => !!g);
	if (!given.length) return null;
	return given.reduce((a, b) => (gradeRank(b) > gradeRank(a) ? b : a));
}

export type OverallResult = { grade: Grade | null; overridden: boolean; problem: string | null };

/** The overall grade: the worst part's, or an override that comes with its reason. */
export function overallGrade(parts: readonly (Grade | null | undefined)[], override?: { grade: Grade | null; reason: string }): OverallResult {
	const worst = worstGrade(parts);
	if (!override?.grade || override.grade === worst) return { grade: worst, overridden: false, problem: null };
	if (override.reason.trim().length < 10) {
		return { grade: worst, overridden: false, problem: 'To grade overall differently from the worst part, say why (at least 10 characters).' };
	}
	return { grade: override.grade, overridden: true, problem: null };
}

/**
 * Months until the next check by overall grade. Common practice, no published source for the
 * numbers; TRADE.md gives "about every six months as a general guideline" [S1] as the reference point
 * (here: poor). The administrator can change them.
 */
export const DEFAULT_INTERVAL_MONTHS: Record<Grade, number> = { good: 24, fair: 12, poor: 6, unacceptable: 1 };

/** The date (YYYY-MM-DD) of the next check after one on `checkedOn` with this grade. */
export function nextCheckDue(checkedOn: string, grade: Grade, intervals: Record<Grade, number> = DEFAULT_INTERVAL_MONTHS): string {
	const [y, m, d] = checkedOn.split('-').map(Number) as [number, number, number];
	if (!y || !m || !d) throw new RangeError(`“${checkedOn}” is not a date (YYYY-MM-DD).`);
	const months = intervals[grade];
	const target = new Date(Date.UTC(y, m - 1 + months, 1));
	// Keep the day of the month where it exists (31 January + 1 month → 28/29 February).
	const lastDay = new Date(Date.UTC(target.getUTCFullYear(), target.getUTCMonth() + 1, 0)).getUTCDate();
	target.setUTCDate(Math.min(d, lastDay));
	return target.toISOString().slice(0, 10);
}

/**
 * A suggested priority: from the overall grade, raised one step for a toxic or unknown hazard on a
 * jar that is poor or worse (it will have to be opened). Common practice, no published source; the
 * conservator can change it.
 */
export function suggestedPriority(grade: Grade | null, toxicHazard: boolean): Priority {
	const base: Record<Grade, Priority> = { good: 'none', fair: 'routine', poor: 'high', unacceptable: 'urgent' };
	if (!grade) return 'none';
	const p = base[grade];
	return toxicHazard && p === 'high' ? 'urgent' : p;
}
