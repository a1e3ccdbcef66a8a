import { createColumnHelper } from '@tanstack/react-table';
import type { SpecimenView } from '../../lib/specimen/view.ts';
import { LABELS } from '../../lib/specimen/vocabulary.ts';
import type { SortKey } from '../../lib/specimen/query.ts';
import { CHECK_LABELS } from '../../lib/check/vocabulary.ts';
import { GradeBadge } from '../check/GradeBadge.tsx';

/** The register's columns; `sort` names the server-side sort key where the column can be sorted. */
const col = createColumnHelper<SpecimenView>();

export const COLUMNS = [
	col.accessor('objectNumber', {
		header: 'Object number',
		meta: { sort: 'objectNumber' satisfies SortKey },
		cell: (c) => (
			<a className="font-mono font-semibold text-glass-700 underline" href={`/specimens/${c.row.original.id}`}>
				{c.getValue()}
			</a>
		),
	}),
	col.accessor('title', { header: 'Specimen', meta: { sort: 'title' satisfies SortKey } }),
	col.accessor((s) => s.storageLocation?.code ?? '—', { id: 'location', header: 'Location', meta: { sort: 'location' satisfies SortKey } }),
	col.accessor('preservativeKind', { header: 'Preservative', meta: { sort: 'preservativeKind' satisfies SortKey }, cell: (c) => LABELS.preservative[c.getValue()] }),
	col.accessor('sealType', { header: 'Seal', meta: { sort: 'sealType' satisfies SortKey }, cell: (c) => LABELS.seal[c.getValue()] }),
	col.accessor('containerShape', { header: 'Jar', cell: (c) => `${LABELS.shape[c.getValue()]}, ${LABELS.material[c.row.original.containerMaterial].toLowerCase()}` }),
	col.accessor('hazards', {
		header: 'Hazards',
		enableSorting: false,
		cell: (c) => c.getValue().map((h) => LABELS.hazard[h.flag]).join('; ') || '—',
	}),
	col.accessor('currentGrade', { header: 'Condition', meta: { sort: 'currentGrade' satisfies SortKey }, cell: (c) => <GradeBadge grade={c.getValue()} /> }),
	col.accessor('currentPriority', { header: 'Priority', meta: { sort: 'currentPriority' satisfies SortKey }, cell: (c) => (c.getValue() ? CHECK_LABELS.priority[c.getValue()!] : '—') }),
	col.accessor('nextCheckDue', { header: 'Next check due', meta: { sort: 'nextCheckDue' satisfies SortKey }, cell: (c) => c.getValue() ?? 'not set' }),
	col.accessor('department', { header: 'Department' }),
	col.accessor('updatedAt', { header: 'Last changed', meta: { sort: 'updatedAt' satisfies SortKey }, cell: (c) => c.getValue().slice(0, 10) }),
];

/** Shown unless the person chooses otherwise. */
export const DEFAULT_HIDDEN = { department: false, updatedAt: false, containerShape: false };
