import { GRADES, PRIORITIES } from '../../check/vocabulary.ts';
import { HAZARD_FLAGS } from '../../specimen/vocabulary.ts';
import type { Overview, OverviewQuery } from '../../overview/schema.ts';
import { scopeSql, select } from './scope.ts';

/**
 * The overview's counts, in two aggregate queries over the specimens in scope: one scan for the
 * totals by grade and priority, overdue and in review; one for the hazard flags. Each count is the
 * row count of the register view its link opens (registerWhere), and the integration test holds
 * them to that.
 */
type Counts = Pick<Overview, 'specimens' | 'byGrade' | 'byPriority' | 'overdue' | 'inReview' | 'byHazard'>;

// Column names are built from the fixed vocabularies, never from input.
const gradeCols = [...GRADES.map((g) => [`g_${g}`, `s.current_grade = '${g}'`]), ['g_unset', 's.current_grade IS NULL']];
const priorityCols = [...PRIORITIES.map((p) => [`p_${p}`, `s.current_priority = '${p}'`]), ['p_unset', 's.current_priority IS NULL']];

export async function figures(q: OverviewQuery, day: string): Promise<Counts> {
	const filtered = [...gradeCols, ...priorityCols].map(([name, cond]) => `count(*) FILTER (WHERE ${cond}) AS "${name}"`).join(',\n');
	const [totals, hazards] = await Promise.all([
		select<Record<string, string>>(
			`SELECT count(*) AS specimens,
			        count(*) FILTER (WHERE s.next_check_due < :day) AS overdue,
			        count(*) FILTER (WHERE s.id IN (SELECT c.specimen_id FROM condition_checks c WHERE c.state = 'in-review')) AS in_review,
			        ${filtered}
			 FROM specimens s WHERE s.deleted_at IS NULL${scopeSql(q)}`,
			q,
			{ day },
		),
		select<{ flag: string; n: string }>(
			`SELECT h->>'flag' AS flag, count(DISTINCT s.id) AS n FROM specimens s, jsonb_array_elements(s.hazards) h
			 WHERE s.deleted_at IS NULL${scopeSql(q)} GROUP BY 1`,
			q,
		),
	]);
	const t = totals[0] ?? {};
	const n = (k: string) => Number(t[k] ?? 0);
	const flags = new Map(hazards.map((h) => [h.flag, Number(h.n)]));
	return {
		specimens: n('specimens'),
		overdue: n('overdue'),
		inReview: n('in_review'),
		byGrade: [...GRADES, 'not-checked' as const].map((grade) => ({ grade, count: n(`g_${grade === 'not-checked' ? 'unset' : grade}`) })),
		byPriority: [...PRIORITIES, 'not-set' as const].map((priority) => ({ priority, count: n(`p_${priority === 'not-set' ? 'unset' : priority}`) })),
		// In the vocabulary's order, with the flags no jar carries left out.
		byHazard: HAZARD_FLAGS.filter((f) => flags.get(f)).map((flag) => ({ flag, count: flags.get(flag)! })),
	};
}
