import type { Grade, Part, Reason } from '../../src/lib/check/vocabulary.ts';

/**
 * What the demo's condition checks found on each invented jar, beyond what the fluid level and the
 * readings show by themselves (demoChecks.ts works those out). A finding's grade moves from its
 * first to its last value over the jar's checks. Wording is invented for the demo.
 */
export type Finding = { part: Part; term: string; grades: [Grade, Grade]; note: string };

export type CheckPlan = {
	findings?: Finding[];
	/** The newest check is still open; otherwise every check is approved. */
	newest?: 'in-review' | 'draft' | 'returned';
	/** Level fall in mm per year, for the jars that are clearly fast. */
	fallMmYear?: number;
	/** Never topped up between checks (fluid unidentified, or waiting for a decision). */
	noTopUp?: boolean;
	firstReason?: Reason;
	firstNote?: string;
	/** What the reviewer asked for, when the newest check was returned. */
	reviewComment?: string;
	/**
	 * Topped up nearly to the lid after the second-newest approved check, and found so at the newest:
	 * the level this many mm below the lid (too little airspace for a warm store).
	 */
	brimMm?: number;
};

const f = (part: Part, term: string, from: Grade, to: Grade, note: string): Finding => ({ part, term, grades: [from, to], note });

export const CHECK_PLANS: Record<string, CheckPlan> = {
	'STC.1898.014': {
		newest: 'in-review',
		findings: [f('seal', 'cracked', 'fair', 'poor', 'Pitch cracked along the lid edge at the back.'), f('label', 'faded', 'fair', 'fair', 'Ink of the old label faded; still legible.')],
	},
	'STC.1902.003': { newest: 'draft', findings: [f('seal', 'dried', 'fair', 'fair', 'Pitch dry and brittle at the back corners.')] },
	'STC.1902.017': {
		brimMm: 0.5,
		findings: [f('seal', 'dried', 'fair', 'fair', 'Wax dull and lifting in places.'), f('mount', 'slack thread', 'good', 'fair', 'Two arm ties slack; arm tips drifting off the plate.')],
	},
	'STC.1905.041': {
		newest: 'in-review',
		findings: [f('lid', 'corroded', 'fair', 'fair', 'White bloom on the lid lining; not disturbed.'), f('seal', 'cracked', 'fair', 'poor', 'Pitch cracked on the left side.')],
	},
	'STC.1905.042': {
		findings: [f('fluid', 'discoloured', 'fair', 'fair', 'Fluid yellow-brown.'), f('seal', 'dried', 'fair', 'fair', 'Pitch dry but whole.')],
		noTopUp: true,
	},
	'STC.1911.008': { brimMm: 0.3, findings: [f('specimen', 'fading / bleaching', 'fair', 'fair', 'Colour paler on the side facing the gallery lights.')] },
	'STC.1920.117': { findings: [f('seal', 'dried', 'good', 'fair', 'Wax round the stopper dry and starting to lift.')] },
	'STC.1923.004': { brimMm: 0, findings: [f('mount', 'slack thread', 'good', 'fair', 'Thread of embryo 5 slack; embryo tilted forward.')] },
	'STC.1923.019': {
		findings: [
			f('mount', 'snapped thread', 'poor', 'poor', 'Thread at the left forelimb snapped; the limb rests against the glass.'),
			f('seal', 'cracked', 'fair', 'fair', 'Fine cracks in the pitch; no weeping.'),
		],
	},
	'STC.1931.251': { findings: [f('seal', 'cracked', 'fair', 'fair', 'Pitch cracked at one corner.'), f('fluid', 'sediment', 'fair', 'fair', 'Fine sediment on the base; left undisturbed.')] },
	'STC.1936.077': { findings: [f('specimen', 'fading / bleaching', 'good', 'fair', 'Gills paler than at the first check.')] },
	'STC.1936.078': {
		newest: 'returned',
		reviewComment: 'No fluid level recorded. With the seal failing, the level is what shows how fast this jar loses fluid: measure it from the inner base, add it and submit again.',
		fallMmYear: 6.5,
		findings: [f('seal', 'failed', 'fair', 'poor', 'Wax lifted along the front; tide marks on the glass.')],
	},
	'STC.1948.002': { findings: [f('specimen', 'fading / bleaching', 'fair', 'fair', 'Red latex fading in the smaller vessels.')] },
	'STC.1948.031': {
		newest: 'draft',
		fallMmYear: 7,
		noTopUp: true,
		firstReason: 'incident',
		firstNote: 'Found with a tide mark and a damp shelf underneath; moved to the quarantine shelf.',
		findings: [f('seal', 'leaking', 'poor', 'unacceptable', 'Seal material not identified; damp at the front edge.')],
	},
	'STC.1952.140': { findings: [f('seal', 'dried', 'fair', 'fair', 'Pitch dry along the top edge.')] },
	'STC.1960.009': { findings: [f('container', 'acrylic scratched', 'fair', 'fair', 'Light scratches on the front face.')] },
	'STC.1960.022': { newest: 'in-review', findings: [f('fluid', 'cloudy', 'fair', 'fair', 'Slime haze in the lower third; deposits on the base.')] },
	'STC.1967.300': { findings: [f('specimen', 'fading / bleaching', 'good', 'fair', 'Coloured threads on the vessels fading in the gallery light.')] },
	'STC.1967.301': {
		findings: [f('seal', 'dried', 'fair', 'fair', 'Wax dry at the corners.'), f('mount', 'slack thread', 'good', 'fair', 'Tie of the third walking leg slack.')],
	},
	'STC.1974.055': { newest: 'in-review', findings: [f('container', 'chipped', 'fair', 'fair', 'Chip on the rim at the back; the lid still seats.')] },
	'STC.1989.204': { findings: [f('container', 'acrylic crazed', 'fair', 'poor', 'Crazing on the left face, spreading towards the base.')] },
	'STC.1995.018': {
		noTopUp: true,
		findings: [
			f('seal', 'perished', 'fair', 'fair', 'Seal material not identified; soft and tacky at the front.'),
			f('specimen', 'tissue loss', 'fair', 'fair', 'Tentacle fragments on the base.'),
		],
	},
};
