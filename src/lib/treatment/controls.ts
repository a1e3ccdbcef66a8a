/**
 * The usual controls for the hazards of fluid-collection work (TRADE.md, "Hazards and their usual
 * controls" [S10][S36][S40b][S42]). Named in the trade's words; an assessor may add their own.
 */
export const CONTROLS = [
	'lev',
	'gloves-nitrile',
	'gloves-cut',
	'gloves-heat',
	'eye-protection',
	'respirator',
	'no-ignition',
	'minimum-quantity',
	'spill-kit',
	'tray',
	'closed-waste',
	'two-people',
	'no-sniffing',
	'let-cool',
] as const;
export type Control = (typeof CONTROLS)[number];

export const CONTROL_LABELS: Record<Control, string> = {
	lev: 'Fume extraction (local exhaust ventilation)',
	'gloves-nitrile': 'Chemical-resistant gloves (e.g. nitrile)',
	'gloves-cut': 'Cut-resistant gloves',
	'gloves-heat': 'Heat-resistant gloves',
	'eye-protection': 'Eye protection',
	respirator: 'Respiratory protective equipment, as the organisation specifies',
	'no-ignition': 'No ignition sources; spark-free tools',
	'minimum-quantity': 'Only the spirit this session needs in the room; the rest in fire-resisting storage',
	'spill-kit': 'Spill kit at hand',
	tray: 'Work in a tray that holds the whole volume',
	'closed-waste': 'Waste in closed, labelled containers for hazardous disposal',
	'two-people': 'Two people for lifting and pouring',
	'no-sniffing': 'Never sniff the fluid; test it',
	'let-cool': 'Let heated tools and softened seals cool before handling',
};
