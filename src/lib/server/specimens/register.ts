import { Op, literal, type Order, type WhereOptions } from 'sequelize';
import { db } from '../db.ts';
import { Specimen, StorageLocation } from '../models/index.ts';
import type { RegisterQuery, SortKey } from '../../specimen/query.ts';
import type { RegisterPage } from '../../specimen/view.ts';
import { specimenView } from './presenter.ts';
import { countedFlammableSql } from '../overview/sql.ts';

/**
 * The register query: filters and search in SQL (parameterised; the search text is escaped for
 * LIKE), sorted by a whitelisted column with the object number as tie-break so pages are stable,
 * one page at a time.
 */
const ORDER: Record<SortKey, (dir: 'ASC' | 'DESC') => Order> = {
	objectNumber: (d) => [['objectNumber', d]],
	title: (d) => [['title', d], ['objectNumber', 'ASC']],
	location: (d) => [[{ model: StorageLocation, as: 'location' }, 'code', d], ['objectNumber', 'ASC']],
	preservativeKind: (d) => [['preservativeKind', d], ['objectNumber', 'ASC']],
	sealType: (d) => [['sealType', d], ['objectNumber', 'ASC']],
	nextCheckDue: (d) => [literal(`"Specimen"."next_check_due" ${d} NULLS LAST`), ['objectNumber', 'ASC']],
	updatedAt: (d) => [['updatedAt', d], ['objectNumber', 'ASC']],
	// By severity, not alphabet; jars never checked sort last either way.
	currentGrade: (d) => [literal(`array_position(ARRAY['good','fair','poor','unacceptable']::varchar[], "Specimen"."current_grade") ${d} NULLS LAST`), ['objectNumber', 'ASC']],
	currentPriority: (d) => [literal(`array_position(ARRAY['none','routine','high','urgent']::varchar[], "Specimen"."current_priority") ${d} NULLS LAST`), ['objectNumber', 'ASC']],
};

export function registerWhere(q: RegisterQuery, today = new Date()): WhereOptions {
	const and: WhereOptions[] = [];
	if (q.q) {
		const like = `%${q.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
		and.push({ [Op.or]: [{ objectNumber: { [Op.iLike]: like } }, { title: { [Op.iLike]: like } }, { department: { [Op.iLike]: like } }] });
	}
	if (q.location) and.push({ storageLocationId: q.location });
	if (q.department) and.push({ department: q.department });
	if (q.preservative) and.push({ preservativeKind: q.preservative });
	if (q.seal) and.push({ sealType: q.seal });
	if (q.shape) and.push({ containerShape: q.shape });
	if (q.hazard) and.push({ hazards: { [Op.contains]: [{ flag: q.hazard }] } } as WhereOptions);
	const day = today.toISOString().slice(0, 10);
	if (q.due === 'overdue') and.push({ nextCheckDue: { [Op.lt]: day } });
	if (q.due === 'within-90-days') {
		const until = new Date(today.getTime() + 90 * 86_400_000).toISOString().slice(0, 10);
		and.push({ nextCheckDue: { [Op.gte]: day, [Op.lt]: until } });
	}
	if (q.due === 'not-set') and.push({ nextCheckDue: null });
	if (q.grade) and.push({ currentGrade: q.grade === 'not-checked' ? null : q.grade });
	if (q.priority) and.push({ currentPriority: q.priority === 'not-set' ? null : q.priority });
	if (q.check) and.push(literal(`EXISTS (SELECT 1 FROM condition_checks c WHERE c.specimen_id = "Specimen"."id" AND c.state = ${db().escape(q.check)})`));
	if (q.flammable) and.push(literal(countedFlammableSql('"Specimen"')));
	return { [Op.and]: and };
}

export async function registerPage(q: RegisterQuery): Promise<RegisterPage> {
	const { rows, count } = await Specimen.findAndCountAll({
		where: registerWhere(q),
		include: [{ model: StorageLocation, as: 'location' }],
		order: ORDER[q.sort](q.dir === 'desc' ? 'DESC' : 'ASC'),
		limit: q.pageSize,
		offset: (q.page - 1) * q.pageSize,
		distinct: true,
	});
	return { rows: rows.map(specimenView), total: count, page: q.page, pageSize: q.pageSize };
}

/** Every row of a filtered view, for export (in pages, so memory stays bounded; no count per page). */
export async function* registerAll(q: RegisterQuery): AsyncGenerator<ReturnType<typeof specimenView>> {
	const size = 500;
	for (let page = 0; ; page++) {
		const rows = await Specimen.findAll({
			where: registerWhere(q),
			include: [{ model: StorageLocation, as: 'location' }],
			order: ORDER[q.sort](q.dir === 'desc' ? 'DESC' : 'ASC'),
			limit: size,
			offset: page * size,
		});
		yield* rows.map(specimenView);
		if (rows.length < size) return;
	}
}
