import { jarFluidMl, FLAMMABLE_KINDS } from '../overview/inventory.ts';
import type { Jar } from '../fluid/jar.ts';
import type { HazardFlag, PreservativeKind, SealType } from '../specimen/vocabulary.ts';
import type { Control } from './controls.ts';
import { STEP_KIND_INFO, type StepKind } from './vocabulary.ts';

/**
 * The hazards of a treatment, and which of them the record suggests (TRADE.md, "Hazards and their
 * usual controls"). Suggestions are a starting point for the assessor, never the assessment: each
 * one is either assessed or dismissed with a reason before the assessment goes for sign-off.
 */
export const HAZARD_KINDS = ['flammable-spirit', 'formaldehyde', 'unknown-fluid', 'historic-seal', 'heated-tools', 'glass', 'other'] as const;
export type HazardKind = (typeof HAZARD_KINDS)[number];

export const HAZARD_LABELS: Record<HazardKind, string> = {
	'flammable-spirit': 'Flammable spirit',
	formaldehyde: 'Formaldehyde',
	'unknown-fluid': 'Unknown fluid',
	'historic-seal': 'Historic seal or lid (lead, arsenic, mercury, coal-tar pitch)',
	'heated-tools': 'Heated tools',
	glass: 'Glass: breakage, splinters, pressure',
	other: 'Other hazard',
};

/** The controls each kind usually calls for ([S10][S36][S40b][S42]); the assessor chooses. */
export const USUAL_CONTROLS: Record<HazardKind, readonly Control[]> = {
	'flammable-spirit': ['no-ignition', 'minimum-quantity', 'lev', 'spill-kit', 'tray'],
	formaldehyde: ['lev', 'gloves-nitrile', 'eye-protection', 'spill-kit', 'closed-waste'],
	'unknown-fluid': ['no-sniffing', 'lev', 'gloves-nitrile', 'eye-protection', 'no-ignition', 'closed-waste'],
	'historic-seal': ['gloves-nitrile', 'lev', 'respirator', 'closed-waste'],
	'heated-tools': ['gloves-heat', 'let-cool', 'no-ignition'],
	glass: ['gloves-cut', 'eye-protection', 'tray', 'two-people'],
	other: [],
};

export interface HazardRecord {
	preservativeKind: PreservativeKind;
	sealType: SealType;
	hazards: readonly { flag: HazardFlag }[];
	jar: Jar;
	/** The latest fluid reading on record, if any. */
	latestFluid: { realPercentVol: number | null; formaldehyde: 'not-tested' | 'negative' | 'positive'; levelMm: number | null } | null;
	/** The kinds of step in the plan (heated tools only matter if the seal is to be opened). */
	steps: readonly StepKind[];
}

export interface SuggestedHazard {
	kind: HazardKind;
	/** Why the record suggests it, in words the assessor can check. */
	reason: string;
}

/**
 * Flash points of ethanol–water mixtures, closed cup, °C, by strength in % vol [S41]; between two
 * rows the value is interpolated linearly (an estimate), below 50 % none is given.
 */
export const ETHANOL_FLASH_POINTS: readonly { percentVol: number; flashC: number }[] = [
	{ percentVol: 50, flashC: 24 },
	{ percentVol: 70, flashC: 21 },
	{ percentVol: 96, flashC: 17 },
	{ percentVol: 100, flashC: 13 },
];

/** Pure propan-2-ol, closed cup, °C [S41][NIOSH Pocket Guide]. */
export const PROPANOL_FLASH_C = 12;

export function ethanolFlashPointC(percentVol: number): number | null {
	const t = ETHANOL_FLASH_POINTS;
	if (!Number.isFinite(percentVol) || percentVol < t[0]!.percentVol || percentVol > 100) return null;
	for (let i = 1; i < t.length; i++) {
		const a = t[i - 1]!;
		const b = t[i]!;
		if (percentVol <= b.percentVol) return a.flashC + ((percentVol - a.percentVol) / (b.percentVol - a.percentVol)) * (b.flashC - a.flashC);
	}
	return null;
}

const HISTORIC_FLAGS: readonly HazardFlag[] = ['lead', 'arsenic', 'mercury', 'coal-tar-pitch'];
const litres = (ml: number) => (ml >= 1000 ? `${(ml / 1000).toFixed(1)} L` : `${Math.round(ml)} mL`);

function spiritReason(r: HazardRecord, flags: readonly HazardFlag[]): string | null {
	const spirit = (FLAMMABLE_KINDS as readonly string[]).includes(r.preservativeKind) || flags.includes('flammable-spirit');
	if (!spirit) return null;
	let quantity = '';
	try {
		quantity = `About ${litres(jarFluidMl(r.jar, r.latestFluid?.levelMm ?? null))} of spirit in the jar${r.latestFluid?.levelMm == null ? ' (no level on record: counted full)' : ''}`;
	} catch {
		quantity = 'The jar’s volume cannot be worked out from its record';
	}
	const strength = r.latestFluid?.realPercentVol ?? null;
	let flash = '';
	if (r.preservativeKind === 'propan-2-ol') flash = `; pure propan-2-ol flashes at about ${PROPANOL_FLASH_C} °C, and no figure is on file for diluted propan-2-ol`;
	else if (strength !== null) {
		const f = ethanolFlashPointC(strength);
		flash = f === null ? `; at ${strength.toFixed(1)} % vol no flash point is on file` : `; at ${strength.toFixed(1)} % vol the flash point is about ${Math.round(f)} °C, below room temperature or near it`;
	} else flash = '; ethanol–water at 50–96 % vol flashes between about 24 and 17 °C';
	return `${quantity}${flash}.`;
}

/** The hazards the record suggests, in a fixed order. */
export function suggestHazards(r: HazardRecord): SuggestedHazard[] {
	const flags = r.hazards.map((h) => h.flag);
	const out: SuggestedHazard[] = [];
	const spirit = spiritReason(r, flags);
	if (spirit) out.push({ kind: 'flammable-spirit', reason: spirit });
	const formalin = r.preservativeKind === 'formalin' || flags.includes('formaldehyde') || r.latestFluid?.formaldehyde === 'positive';
	if (formalin) {
		const why = r.preservativeKind === 'formalin' ? 'The record gives formalin as the preservative.' : r.latestFluid?.formaldehyde === 'positive' ? 'The latest fluid test was positive for formaldehyde.' : 'The record flags formaldehyde.';
		out.push({ kind: 'formaldehyde', reason: why });
	}
	if (r.preservativeKind === 'unknown' || flags.includes('unknown-fluid')) {
		out.push({ kind: 'unknown-fluid', reason: 'The fluid is not identified: presume it toxic and flammable until it is tested [S40b].' });
	}
	const historic = flags.filter((f) => HISTORIC_FLAGS.includes(f));
	if (historic.length > 0 || r.sealType === 'pitch' || r.sealType === 'unknown') {
		const parts: string[] = [];
		if (historic.length > 0) parts.push(`the record flags ${historic.join(', ')}`);
		if (r.sealType === 'pitch') parts.push('the seal is pitch or bitumen, which may be coal-tar pitch (a known human carcinogen [S110])');
		if (r.sealType === 'unknown') parts.push('the seal is not identified');
		out.push({ kind: 'historic-seal', reason: `Old seals and lids may hold lead, arsenic, mercury or coal-tar pitch [S10][S40a]: ${parts.join('; ')}.` });
	}
	const opens = r.steps.includes('open-seal');
	if (opens && (r.sealType === 'pitch' || r.sealType === 'wax')) {
		out.push({ kind: 'heated-tools', reason: `The plan opens a ${r.sealType === 'pitch' ? 'pitch' : 'wax'} seal, which is softened with heat: burns, and heat near spirit vapour.` });
	}
	if (r.steps.some((k) => STEP_KIND_INFO[k].work)) {
		out.push({ kind: 'glass', reason: 'Handling the jar: old glass splinters, and a warmed jar builds pressure [S27a][S27b].' });
	}
	return out;
}
