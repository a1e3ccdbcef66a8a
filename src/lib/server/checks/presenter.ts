import type { ConditionCheck, Specimen, User } from '../models/index.ts';
import type { CheckView } from '../../check/view.ts';

type Loaded = ConditionCheck & { specimen?: Specimen; examiner?: User; reviewer?: User | null };

/** A check row, loaded with its specimen, examiner and reviewer, as the API shows it. */
export function checkView(c: Loaded): CheckView {
	return {
		id: c.id,
		specimen: {
			id: c.specimenId,
			objectNumber: c.specimen?.objectNumber ?? '',
			title: c.specimen?.title ?? '',
			hazards: (c.specimen?.hazards ?? []).map((h) => ({ flag: h.flag, note: h.note ?? '' })),
		},
		checkedOn: c.checkedOn,
		examiner: { id: c.examinerId, name: c.examiner?.name ?? '' },
		reason: c.reason,
		state: c.state,
		parts: c.parts,
		overallGrade: c.overallGrade,
		overallOverrideReason: c.overallOverrideReason,
		priority: c.priority,
		nextCheckDue: c.nextCheckDue,
		notes: c.notes,
		fluid: c.fluid,
		correctsCheckId: c.correctsCheckId,
		submittedAt: c.submittedAt?.toISOString() ?? null,
		reviewer: c.reviewerId ? { id: c.reviewerId, name: c.reviewer?.name ?? '' } : null,
		reviewedAt: c.reviewedAt?.toISOString() ?? null,
		reviewComment: c.reviewComment,
		version: c.version,
		updatedAt: c.updatedAt.toISOString(),
	};
}
