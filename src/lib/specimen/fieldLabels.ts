/** How the fields of a specimen record are named on screen (history, conflict notices). */
export const FIELD_LABELS: Record<string, string> = {
	objectNumber: 'Object number',
	title: 'Title',
	description: 'Description',
	department: 'Department',
	storageLocation: 'Storage location',
	preservativeRecorded: 'Preservative as recorded',
	preservativeKind: 'Preservative',
	containerShape: 'Shape',
	innerWidthMm: 'Inner width (mm)',
	innerDepthMm: 'Inner depth (mm)',
	innerHeightMm: 'Inner height (mm)',
	specimenTopMm: 'Top of the specimen (mm)',
	containerMaterial: 'Material',
	closureType: 'Closure',
	sealType: 'Seal',
	hazards: 'Hazards',
	nextCheckDue: 'Next check due',
	currentGrade: 'Condition',
	currentPriority: 'Priority',
	lastCheckedOn: 'Last approved check',
};

/** A stored value as a person reads it: a location by its code, hazards by flag, empty as a dash. */
export function showValue(v: unknown): string {
	if (v === null || v === undefined || v === '') return '—';
	if (Array.isArray(v)) return v.map((x) => (x && typeof x === 'object' && 'flag' in x ? String(x.flag) : JSON.stringify(x))).join(', ') || '—';
	if (typeof v === 'object') return 'code' in v ? String((v as { code: unknown }).code) : JSON.stringify(v);
	return String(v);
}
