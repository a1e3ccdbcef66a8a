/**
 * The fixed vocabularies of a specimen record (DESIGN.md §3, TRADE.md). Values are stored; labels
 * are shown. Terms are the trade's own words.
 */
export const CONTAINER_SHAPES = ['cylinder', 'oval', 'rectangular'] as const;
export const CONTAINER_MATERIALS = ['soda-lime', 'borosilicate', 'acrylic'] as const;
export const CLOSURE_TYPES = [
	'glass-lid',
	'ground-glass-stopper',
	'screw-cap',
	'bail-clamp',
	'snap-on',
	'other',
] as const;
export const SEAL_TYPES = ['pitch', 'silicone', 'wax', 'gasket', 'unknown'] as const;
export const PRESERVATIVE_KINDS = [
	'ethanol',
	'industrial-spirit',
	'propan-2-ol',
	'formalin',
	'unknown',
	'other',
] as const;
export const HAZARD_FLAGS = [
	'flammable-spirit',
	'formaldehyde',
	'unknown-fluid',
	'lead',
	'arsenic',
	'mercury',
	'coal-tar-pitch',
	'damaged-glass',
] as const;

export type ContainerShape = (typeof CONTAINER_SHAPES)[number];
export type ContainerMaterial = (typeof CONTAINER_MATERIALS)[number];
export type ClosureType = (typeof CLOSURE_TYPES)[number];
export type SealType = (typeof SEAL_TYPES)[number];
export type PreservativeKind = (typeof PRESERVATIVE_KINDS)[number];
export type HazardFlag = (typeof HAZARD_FLAGS)[number];

export const LABELS = {
	shape: { cylinder: 'Cylinder', oval: 'Oval (elliptic)', rectangular: 'Rectangular' },
	material: { 'soda-lime': 'Soda-lime glass', borosilicate: 'Borosilicate glass', acrylic: 'Acrylic' },
	closure: {
		'glass-lid': 'Glass lid',
		'ground-glass-stopper': 'Ground-glass stopper',
		'screw-cap': 'Screw cap',
		'bail-clamp': 'Bail / clamp',
		'snap-on': 'Snap-on lid',
		other: 'Other',
	},
	seal: {
		pitch: 'Pitch / bitumen',
		silicone: 'Silicone',
		wax: 'Wax',
		gasket: 'Gasket',
		unknown: 'Unknown',
	},
	preservative: {
		ethanol: 'Ethanol',
		'industrial-spirit': 'Industrial methylated spirit',
		'propan-2-ol': 'Propan-2-ol (isopropanol)',
		formalin: 'Formalin',
		unknown: 'Unknown fluid',
		other: 'Other',
	},
	hazard: {
		'flammable-spirit': 'Flammable spirit',
		formaldehyde: 'Formaldehyde',
		'unknown-fluid': 'Unknown fluid: presume toxic and flammable',
		lead: 'Lead (lid lining or seal)',
		arsenic: 'Arsenic',
		mercury: 'Mercury compounds',
		'coal-tar-pitch': 'Coal-tar pitch seal',
		'damaged-glass': 'Damaged glass',
	},
} as const satisfies {
	shape: Record<ContainerShape, string>;
	material: Record<ContainerMaterial, string>;
	closure: Record<ClosureType, string>;
	seal: Record<SealType, string>;
	preservative: Record<PreservativeKind, string>;
	hazard: Record<HazardFlag, string>;
};
