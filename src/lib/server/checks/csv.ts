import { Op, type WhereOptions } from 'sequelize';
import { ConditionCheck, Specimen, User } from '../models/index.ts';
import { defuse } from '../csvExport.ts';
import { CHECK_LABELS, PARTS } from '../../check/vocabulary.ts';
import type { CheckExportQuery } from '../../check/exportQuery.ts';

/**
 * Condition checks as CSV, one check a row, ordered by object number and then date. Vocabulary
 * fields (reason, state, grades, priority, formaldehyde) are written as their stored codes, as the
 * register export does, so a spreadsheet filters on stable words; each part has a grade column and a
 * terms column (terms separated by " | "). Formula-like cells are defused (csvExport.ts).
 */
export const CHECK_EXPORT_COLUMNS = [
	'Object number', 'Check id', 'Date', 'Reason', 'State', 'Examiner', 'Reviewer', 'Reviewed at', 'Overall grade', 'Priority',
	...PARTS.flatMap((p) => [`${CHECK_LABELS.part[p]} grade`, `${CHECK_LABELS.part[p]} terms`]),
	'Fluid level (mm)', 'Reading (% vol)', 'Temperature (°C)', 'Real strength (% vol at 20 °C)', 'pH', 'Formaldehyde',
	'Next due', 'Corrects check id', 'Notes',
] as const;

type Loaded = ConditionCheck & { specimen?: Specimen; examiner?: User; reviewer?: User | null };

const n = (v: number | null | undefined) => (v === null || v === undefined ? '' : String(v));

export function checkRow(c: Loaded): string[] {
	const f = c.fluid;
	return [
		c.specimen?.objectNumber ?? '', c.id, c.checkedOn, c.reason, c.state, c.examiner?.name ?? '', c.reviewer?.name ?? '',
		c.reviewedAt?.toISOString() ?? '', c.overallGrade ?? '', c.priority ?? '',
		...PARTS.flatMap((p) => [c.parts[p]?.grade ?? '', (c.parts[p]?.terms ?? []).join(' | ')]),
		n(f?.levelMm), n(f?.readingPercentVol), n(f?.tempC), n(f?.realPercentVol), n(f?.pH), f?.formaldehyde ?? '',
		c.nextCheckDue ?? '', c.correctsCheckId ?? '', c.notes,
	].map(defuse);
}

/** The rows of every check the filter selects. */
export async function checkExportRows(q: CheckExportQuery): Promise<string[][]> {
	const where: WhereOptions<ConditionCheck> = {
		...(q.specimen ? { specimenId: q.specimen } : {}),
		...(q.from || q.to ? { checkedOn: { ...(q.from ? { [Op.gte]: q.from } : {}), ...(q.to ? { [Op.lte]: q.to } : {}) } } : {}),
	};
	const rows = (await ConditionCheck.findAll({
		where,
		include: [
			{ model: Specimen, as: 'specimen', attributes: ['id', 'objectNumber'] },
			{ model: User, as: 'examiner', attributes: ['id', 'name'] },
			{ model: User, as: 'reviewer', attributes: ['id', 'name'] },
		],
		order: [[{ model: Specimen, as: 'specimen' }, 'objectNumber', 'ASC'], ['checkedOn', 'ASC'], ['createdAt', 'ASC']],
	})) as Loaded[];
	return rows.map(checkRow);
}
