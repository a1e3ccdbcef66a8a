import type { Specimen, StorageLocation } from '../models/index.ts';
import type { SpecimenView } from '../../specimen/view.ts';

/** A specimen row (with its location, when loaded) as the API shows it. */
export function specimenView(s: Specimen & { location?: StorageLocation | null }): SpecimenView {
	return {
		id: s.id,
		objectNumber: s.objectNumber,
		title: s.title,
		description: s.description,
		department: s.department,
		storageLocation: s.location ? { id: s.location.id, code: s.location.code, name: s.location.name } : null,
		preservativeRecorded: s.preservativeRecorded,
		preservativeKind: s.preservativeKind,
		containerShape: s.containerShape,
		innerWidthMm: s.innerWidthMm,
		innerDepthMm: s.innerDepthMm,
		innerHeightMm: s.innerHeightMm,
		specimenTopMm: s.specimenTopMm ?? null,
		containerMaterial: s.containerMaterial,
		closureType: s.closureType,
		sealType: s.sealType,
		hazards: s.hazards.map((h) => ({ flag: h.flag, note: h.note ?? '' })),
		nextCheckDue: s.nextCheckDue,
		currentGrade: s.currentGrade ?? null,
		currentPriority: s.currentPriority ?? null,
		lastCheckedOn: s.lastCheckedOn ?? null,
		version: s.version,
		createdAt: s.createdAt.toISOString(),
		updatedAt: s.updatedAt.toISOString(),
	};
}
