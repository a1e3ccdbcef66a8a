import { DamageTerm, GradeInterval } from '../models/index.ts';
import { DEFAULT_INTERVAL_MONTHS } from '../../check/grading.ts';
import { DEFAULT_TERMS, GRADES, PARTS, type Grade, type Part } from '../../check/vocabulary.ts';

/** The check intervals in force: the defaults, with the administrator's changes over them. */
export async function intervals(): Promise<Record<Grade, number>> {
	const rows = await GradeInterval.findAll();
	return { ...DEFAULT_INTERVAL_MONTHS, ...Object.fromEntries(rows.map((r) => [r.grade, r.months])) };
}

export async function setIntervals(values: Record<Grade, number>): Promise<Record<Grade, number>> {
	for (const grade of GRADES) await GradeInterval.upsert({ grade, months: values[grade] });
	return intervals();
}

/** The damage vocabulary of every part: the built-in terms, then the administrator's. */
export async function vocabulary(): Promise<Record<Part, string[]>> {
	const extra = await DamageTerm.findAll({ where: { active: true }, order: [['term', 'ASC']] });
	const out = Object.fromEntries(PARTS.map((p) => [p, [...DEFAULT_TERMS[p]]])) as Record<Part, string[]>;
	for (const t of extra) if (!out[t.part].includes(t.term)) out[t.part].push(t.term);
	return out;
}
