import type { HazardKind } from './hazards.ts';

/**
 * The cautions shown beside each hazard, with reference values from TRADE.md and its sources.
 * They are reminders, not safety advice: the governing statement below is shown with them.
 */
export const GOVERNING_STATEMENT =
	'Meniscus gives no safety advice of its own. Local regulations, your organisation’s own risk assessment and qualified practice govern this work; this record does not replace them.';

/** Occupational exposure limits for formaldehyde, as reference values [S37][S38]. */
export const FORMALDEHYDE_LIMITS: readonly { where: string; value: string; source: string }[] = [
	{ where: 'US OSHA permissible exposure limit', value: '0.75 ppm (8-hour TWA); 2 ppm short-term (15 min); action level 0.5 ppm', source: '29 CFR 1910.1048 [S38]' },
	{ where: 'Great Britain workplace exposure limit', value: '2 ppm', source: 'UK Parliament written answer HL3278 [S37]' },
	{ where: 'EU binding limit', value: '0.3 ppm', source: 'UK Parliament written answer HL3278 [S37]' },
];

export const HAZARD_CAUTIONS: Record<HazardKind, string> = {
	'flammable-spirit':
		'Ethanol–water mixtures flash at about 24 °C (50 %), 21 °C (70 %) and 17 °C (96 %), pure ethanol at 13 °C and propan-2-ol at about 12 °C (closed cup [S41]): an ordinary workroom is above them. Keep only what the session needs in the room; fire codes are local [S28][S42].',
	formaldehyde: 'Formaldehyde is a sensitiser and carcinogen. Exposure limits: US OSHA 0.75 ppm over 8 hours, 2 ppm short-term, action level 0.5 ppm [S38]; GB 2 ppm; EU 0.3 ppm [S37]. Old formalin turns acidic [S16].',
	'unknown-fluid': 'Presume an unknown fluid toxic and flammable [S40b]; never sniff it [S11][S20]. Historic fluids may hold arsenic, mercuric chloride, lead or acids [S10][S31c].',
	'historic-seal': 'Some lids are lead-lined [S40a]; coal-tar pitch is a known human carcinogen [S110]; historic fluids and seals may hold arsenic or mercury compounds [S10]. Treat old sealant and scrapings as hazardous waste.',
	'heated-tools': 'Heated tools burn, and heat near spirit vapour can ignite it. A warmed jar builds pressure [S27a].',
	glass: 'Old glass splinters and may fail under handling; warming a full jar can build up pressure (up to about 2 bar [S27a][S76b]).',
	other: '',
};

export const ACID_CURE_CAUTION = 'Acid-cure silicone gives off acetic acid for days to weeks; a neutral-cure sealant is preferred near specimens [S35c][S92].';
