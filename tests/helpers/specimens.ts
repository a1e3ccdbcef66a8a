/** A valid specimen record for API tests, with a unique object number per call. */
let n = 0;
export function specimenRecord(prefix: string, over: Record<string, unknown> = {}) {
	return {
		objectNumber: `${prefix}.${String(n++).padStart(3, '0')}`,
		title: 'Test newt, whole',
		preservativeKind: 'ethanol',
		containerShape: 'cylinder',
		innerWidthMm: 80,
		innerHeightMm: 160,
		containerMaterial: 'soda-lime',
		closureType: 'glass-lid',
		sealType: 'silicone',
		hazards: [{ flag: 'flammable-spirit', note: '' }],
		...over,
	};
}
