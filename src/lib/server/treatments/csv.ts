import { Op, type WhereOptions } from 'sequelize';
import { Specimen, Treatment, User } from '../models/index.ts';
import { defuse } from '../csvExport.ts';
import { BAND_LABELS, bandOf, worstBand } from '../../treatment/risk.ts';
import { cureStatus } from '../../treatment/cure.ts';
import type { CheckExportQuery } from '../../check/exportQuery.ts';

/**
 * Treatments as CSV, one treatment a row, ordered by object number and then the day it was
 * planned; the same filters as the checks export (specimen, and a range of days on the planning
 * date). States are stored codes; lists inside a cell are separated by " | "; formula-like cells
 * are defused (csvExport.ts).
 */
export const TREATMENT_EXPORT_COLUMNS = [
	'Object number', 'Treatment id', 'Title', 'Planned on', 'State', 'Author', 'Before check id', 'After check id',
	'Risk assessment', 'Signed off by', 'Signed off at', 'Hazards (residual)', 'Worst residual',
	'Steps done', 'Steps in plan', 'Time spent (min)', 'Materials', 'Fluid batches (% vol)', 'May be disturbed from', 'Closed at', 'Purpose',
] as const;

type Loaded = Treatment & { specimen?: Specimen; author?: User; riskReviewer?: User | null };

export function treatmentRow(t: Loaded): string[] {
	const hazards = t.risk.hazards.map((h) => `${h.kind}: ${BAND_LABELS[bandOf(h.residual)].toLowerCase()}`);
	const worst = worstBand(t.risk.hazards.map((h) => h.residual));
	const materials = t.steps.flatMap((s) => s.materials.filter((m) => m.kind !== 'fluid').map((m) => `${m.name}${m.amount ? ` (${m.amount})` : ''}`));
	const fluids = t.steps.flatMap((s) =>
		s.materials.flatMap((m) => (m.fluid ? [`${m.fluid.batch || 'batch'} ${m.fluid.preservativeKind} ${m.fluid.realPercentVol ?? m.fluid.statedPercentVol ?? '?'}`] : [])),
	);
	const signed = t.riskState === 'signed-off';
	return [
		t.specimen?.objectNumber ?? '', t.id, t.title, t.createdAt.toISOString().slice(0, 10), t.state, t.author?.name ?? '',
		t.beforeCheckId ?? '', t.afterCheckId ?? '', t.riskState, signed ? (t.riskReviewer?.name ?? '') : '', signed ? (t.riskReviewedAt?.toISOString() ?? '') : '',
		hazards.join(' | '), worst ?? '',
		String(t.steps.filter((s) => s.status === 'done').length), String(t.steps.filter((s) => s.status !== 'skipped').length),
		String(t.steps.reduce((sum, s) => sum + (s.minutes ?? 0), 0)), materials.join(' | '), fluids.join(' | '),
		cureStatus(t.steps, new Date()).mayDisturbAt ?? '', t.completedAt?.toISOString() ?? '', t.purpose,
	].map(defuse);
}

export async function treatmentExportRows(q: CheckExportQuery): Promise<string[][]> {
	const day = (d: string, end: boolean) => new Date(`${d}T${end ? '23:59:59.999' : '00:00:00.000'}Z`);
	const where: WhereOptions<Treatment> = {
		...(q.specimen ? { specimenId: q.specimen } : {}),
		...(q.from || q.to ? { createdAt: { ...(q.from ? { [Op.gte]: day(q.from, false) } : {}), ...(q.to ? { [Op.lte]: day(q.to, true) } : {}) } } : {}),
	};
	const rows = (await Treatment.findAll({
		where,
		include: [
			{ model: Specimen, as: 'specimen', attributes: ['id', 'objectNumber'] },
			{ model: User, as: 'author', attributes: ['id', 'name'] },
			{ model: User, as: 'riskReviewer', attributes: ['id', 'name'] },
		],
		order: [[{ model: Specimen, as: 'specimen' }, 'objectNumber', 'ASC'], ['createdAt', 'ASC']],
	})) as Loaded[];
	return rows.map(treatmentRow);
}
