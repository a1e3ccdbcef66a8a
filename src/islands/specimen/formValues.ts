import type { SpecimenInput } from '../../lib/specimen/schema.ts';
import type { SpecimenView } from '../../lib/specimen/view.ts';
import { HAZARD_FLAGS, type HazardFlag } from '../../lib/specimen/vocabulary.ts';

/**
 * What the specimen form holds (strings and check boxes, as inputs give them) and its conversion to
 * the shared SpecimenSchema input, which the server validates the same way.
 */
export interface FormValues {
	objectNumber: string;
	title: string;
	description: string;
	department: string;
	storageLocationId: string;
	preservativeRecorded: string;
	preservativeKind: string;
	containerShape: string;
	innerWidthMm: string;
	innerDepthMm: string;
	innerHeightMm: string;
	specimenTopMm: string;
	containerMaterial: string;
	closureType: string;
	sealType: string;
	nextCheckDue: string;
	hazards: Record<HazardFlag, { on: boolean; note: string }>;
}

const num = (s: string) => (s.trim() === '' ? Number.NaN : Number(s.trim().replace(',', '.')));

export function emptyForm(): FormValues {
	return {
		objectNumber: '', title: '', description: '', department: '', storageLocationId: '', preservativeRecorded: '',
		preservativeKind: 'ethanol', containerShape: 'cylinder', innerWidthMm: '', innerDepthMm: '', innerHeightMm: '', specimenTopMm: '',
		containerMaterial: 'soda-lime', closureType: 'glass-lid', sealType: 'unknown', nextCheckDue: '',
		hazards: Object.fromEntries(HAZARD_FLAGS.map((f) => [f, { on: false, note: '' }])) as FormValues['hazards'],
	};
}

export function fromView(s: SpecimenView): FormValues {
	const f = emptyForm();
	for (const h of s.hazards) f.hazards[h.flag] = { on: true, note: h.note };
	return {
		...f,
		objectNumber: s.objectNumber, title: s.title, description: s.description, department: s.department,
		storageLocationId: s.storageLocation?.id ?? '', preservativeRecorded: s.preservativeRecorded,
		preservativeKind: s.preservativeKind, containerShape: s.containerShape, innerWidthMm: String(s.innerWidthMm),
		innerDepthMm: s.innerDepthMm === null ? '' : String(s.innerDepthMm), innerHeightMm: String(s.innerHeightMm),
		specimenTopMm: s.specimenTopMm === null ? '' : String(s.specimenTopMm),
		containerMaterial: s.containerMaterial, closureType: s.closureType, sealType: s.sealType, nextCheckDue: s.nextCheckDue ?? '',
	};
}

export function toInput(v: FormValues): SpecimenInput {
	return {
		objectNumber: v.objectNumber,
		title: v.title,
		description: v.description,
		department: v.department,
		storageLocationId: v.storageLocationId || null,
		preservativeRecorded: v.preservativeRecorded,
		preservativeKind: v.preservativeKind as SpecimenInput['preservativeKind'],
		containerShape: v.containerShape as SpecimenInput['containerShape'],
		innerWidthMm: num(v.innerWidthMm),
		// An empty second dimension is “not given”, which the schema explains better than “not a number”.
		innerDepthMm: v.containerShape === 'cylinder' || v.innerDepthMm.trim() === '' ? null : num(v.innerDepthMm),
		innerHeightMm: num(v.innerHeightMm),
		specimenTopMm: v.specimenTopMm.trim() === '' ? null : num(v.specimenTopMm),
		containerMaterial: v.containerMaterial as SpecimenInput['containerMaterial'],
		closureType: v.closureType as SpecimenInput['closureType'],
		sealType: v.sealType as SpecimenInput['sealType'],
		hazards: HAZARD_FLAGS.filter((f) => v.hazards[f].on).map((flag) => ({ flag, note: v.hazards[flag].note })),
		nextCheckDue: v.nextCheckDue || null,
	};
}
