import type {
	ClosureType,
	ContainerMaterial,
	ContainerShape,
	HazardFlag,
	PreservativeKind,
	SealType,
} from '../../src/lib/specimen/vocabulary.ts';
import type { Role } from '../../src/lib/auth/roles.ts';

/**
 * An invented scenario for the demo only: the Saltmarsh Teaching Collection of an imaginary school
 * of anatomy, its four staff and thirty of its jars. Object numbers, people and places are made up;
 * dimensions and fluids are plausible for the trade, not taken from any real collection.
 */
export const DEMO_USERS: { email: string; name: string; role: Role }[] = [
	{ email: 'conservator@example.org', name: 'Ines Marlowe-Adebayo', role: 'conservator' },
	{ email: 'reviewer@example.org', name: 'Tobiah Quennell', role: 'reviewer' },
	{ email: 'curator@example.org', name: 'Rosalind Okafor-Vane', role: 'curator' },
	{ email: 'admin@example.org', name: 'Pim Castellanos', role: 'admin' },
];

/**
 * The stores, with invented flammable limits (litres) and expected temperature ranges (°C): spirit
 * store A bay 1 is near its limit, the gallery case warms under its lights, and the quarantine shelf
 * has neither set, as a newly listed location would.
 */
export const DEMO_LOCATIONS = [
	{ code: 'SPR-A1', name: 'Spirit store A, bay 1', notes: 'Flammables store; fire-resisting cabinets along the north wall.', limitL: 11, minC: 16, maxC: 23 },
	{ code: 'SPR-A2', name: 'Spirit store A, bay 2', notes: '', limitL: 40, minC: 16, maxC: 24 },
	{ code: 'SPR-B1', name: 'Spirit store B, bay 1', notes: 'Cooler room, about 15 °C in winter.', limitL: 25, minC: 13, maxC: 19 },
	{ code: 'FRM-1', name: 'Formalin room, shelf run 1', notes: 'Local exhaust ventilation at the bench.', limitL: 10, minC: 17, maxC: 22 },
	{ code: 'GAL-2', name: 'Teaching gallery, case 2', notes: 'On display; lit 8 hours a day.', limitL: 8, minC: 19, maxC: 28 },
	{ code: 'QRT-1', name: 'Quarantine shelf', notes: 'Jars with unknown fluid or leaking seals awaiting assessment.', limitL: null, minC: null, maxC: null },
];

/** Jars whose specimen top was never measured, so the demo shows a history without that forecast. */
export const DEMO_TOP_NOT_MEASURED = new Set(['STC.1931.251', 'STC.2004.001']);

type Demo = {
	objectNumber: string;
	title: string;
	description: string;
	department: string;
	location: string;
	preservativeRecorded: string;
	preservativeKind: PreservativeKind;
	shape: ContainerShape;
	/** Inner width (diameter / major axis), depth (minor axis / depth, null for a cylinder), height, in mm. */
	dims: [number, number | null, number];
	material: ContainerMaterial;
	closure: ClosureType;
	seal: SealType;
	hazards: { flag: HazardFlag; note: string }[];
	/** Next check due, in days from the seeding date (negative: overdue). */
	dueInDays: number | null;
};

const ZOO = 'Zoology teaching series';
const ANA = 'Comparative anatomy';
const PATH = 'Pathology teaching series';
const spirit = { flag: 'flammable-spirit', note: '' } as const;
const hz = (flag: HazardFlag, note = '') => ({ flag, note });

export const DEMO_SPECIMENS: Demo[] = [
	{ objectNumber: 'STC.1898.014', title: 'Common frog, dissected to show the viscera', description: 'Ventral dissection pinned to a glass plate; thread suspension.', department: ZOO, location: 'SPR-A1', preservativeRecorded: 'spirit (label, 1898)', preservativeKind: 'ethanol', shape: 'cylinder', dims: [90, null, 180], material: 'soda-lime', closure: 'glass-lid', seal: 'pitch', hazards: [spirit, hz('coal-tar-pitch', 'Black seal, original.')], dueInDays: -120 },
	{ objectNumber: 'STC.1898.015', title: 'Grass snake, coiled', description: 'Whole specimen coiled around a glass rod.', department: ZOO, location: 'SPR-A1', preservativeRecorded: '70% ethanol', preservativeKind: 'ethanol', shape: 'cylinder', dims: [120, null, 160], material: 'soda-lime', closure: 'glass-lid', seal: 'silicone', hazards: [spirit], dueInDays: 40 },
	{ objectNumber: 'STC.1902.003', title: 'Dogfish, lateral dissection of the head', description: 'Cranial nerves picked out; mica backing sheet.', department: ANA, location: 'SPR-A2', preservativeRecorded: 'IMS 80%', preservativeKind: 'industrial-spirit', shape: 'rectangular', dims: [210, 70, 300], material: 'soda-lime', closure: 'glass-lid', seal: 'pitch', hazards: [spirit, hz('coal-tar-pitch')], dueInDays: -30 },
	{ objectNumber: 'STC.1902.017', title: 'Octopus, whole', description: 'Arms spread and tied to a glass back plate.', department: ZOO, location: 'SPR-A2', preservativeRecorded: 'alcohol', preservativeKind: 'ethanol', shape: 'oval', dims: [240, 150, 320], material: 'soda-lime', closure: 'glass-lid', seal: 'wax', hazards: [spirit], dueInDays: 200 },
	{ objectNumber: 'STC.1905.041', title: 'Human fetal heart, opened', description: 'Opened to show the foramen ovale; teaching preparation.', department: PATH, location: 'FRM-1', preservativeRecorded: 'formalin 10%', preservativeKind: 'formalin', shape: 'cylinder', dims: [75, null, 120], material: 'soda-lime', closure: 'glass-lid', seal: 'pitch', hazards: [hz('formaldehyde'), hz('lead', 'Lid may be lead-lined (era and maker).')], dueInDays: -400 },
	{ objectNumber: 'STC.1905.042', title: 'Kidney with staghorn calculus', description: 'Bisected; calculus left in place.', department: PATH, location: 'FRM-1', preservativeRecorded: 'Kaiserling III then spirit', preservativeKind: 'other', shape: 'rectangular', dims: [160, 60, 200], material: 'soda-lime', closure: 'glass-lid', seal: 'pitch', hazards: [hz('unknown-fluid', 'Label names a glycerol–acetate mixture; strength unknown.'), hz('coal-tar-pitch')], dueInDays: -15 },
	{ objectNumber: 'STC.1911.008', title: 'Chameleon on a twig', description: 'Mounted on a natural twig wired to a glass rod.', department: ZOO, location: 'GAL-2', preservativeRecorded: '75% ethanol', preservativeKind: 'ethanol', shape: 'cylinder', dims: [100, null, 220], material: 'borosilicate', closure: 'screw-cap', seal: 'gasket', hazards: [spirit], dueInDays: 12 },
	{ objectNumber: 'STC.1911.009', title: 'Seahorse pair', description: 'Two specimens on one thread mount.', department: ZOO, location: 'GAL-2', preservativeRecorded: '75% ethanol', preservativeKind: 'ethanol', shape: 'cylinder', dims: [60, null, 140], material: 'borosilicate', closure: 'screw-cap', seal: 'gasket', hazards: [spirit], dueInDays: 12 },
	{ objectNumber: 'STC.1920.101', title: 'Cat brain, sagittal half', description: 'Half brain on a glass plate; label on the front.', department: ANA, location: 'FRM-1', preservativeRecorded: 'formol saline', preservativeKind: 'formalin', shape: 'rectangular', dims: [140, 50, 180], material: 'soda-lime', closure: 'glass-lid', seal: 'silicone', hazards: [hz('formaldehyde')], dueInDays: 75 },
	{ objectNumber: 'STC.1920.117', title: 'Lamprey, oral disc', description: 'Head only, oral disc facing the front of the jar.', department: ZOO, location: 'SPR-B1', preservativeRecorded: 'spirit', preservativeKind: 'ethanol', shape: 'cylinder', dims: [70, null, 150], material: 'soda-lime', closure: 'ground-glass-stopper', seal: 'wax', hazards: [spirit], dueInDays: 310 },
	{ objectNumber: 'STC.1923.004', title: 'Chick embryo series, days 3 to 9', description: 'Seven embryos on one back sheet, each numbered.', department: ANA, location: 'SPR-B1', preservativeRecorded: '70% ethanol', preservativeKind: 'ethanol', shape: 'rectangular', dims: [180, 45, 220], material: 'soda-lime', closure: 'glass-lid', seal: 'silicone', hazards: [spirit], dueInDays: 150 },
	{ objectNumber: 'STC.1923.019', title: 'Mole, whole, forelimbs spread', description: 'Thread snapped at the left forelimb (noted 2019).', department: ZOO, location: 'SPR-A2', preservativeRecorded: '70%', preservativeKind: 'ethanol', shape: 'cylinder', dims: [85, null, 150], material: 'soda-lime', closure: 'glass-lid', seal: 'pitch', hazards: [spirit, hz('coal-tar-pitch')], dueInDays: -60 },
	{ objectNumber: 'STC.1931.250', title: 'Tapeworm, scolex and proglottids', description: 'Coiled on a glass plate.', department: PATH, location: 'SPR-A1', preservativeRecorded: 'isopropyl alcohol 50%', preservativeKind: 'propan-2-ol', shape: 'cylinder', dims: [110, null, 200], material: 'soda-lime', closure: 'screw-cap', seal: 'gasket', hazards: [spirit], dueInDays: 90 },
	{ objectNumber: 'STC.1931.251', title: 'Liver fluke in a section of sheep liver', description: 'Slice with bile ducts opened.', department: PATH, location: 'FRM-1', preservativeRecorded: 'formalin', preservativeKind: 'formalin', shape: 'rectangular', dims: [120, 40, 160], material: 'soda-lime', closure: 'glass-lid', seal: 'pitch', hazards: [hz('formaldehyde'), hz('coal-tar-pitch')], dueInDays: -5 },
	{ objectNumber: 'STC.1936.077', title: 'Axolotl, adult', description: 'Suspended from the lid by two threads.', department: ZOO, location: 'GAL-2', preservativeRecorded: '70% ethanol', preservativeKind: 'ethanol', shape: 'cylinder', dims: [80, null, 200], material: 'borosilicate', closure: 'glass-lid', seal: 'silicone', hazards: [spirit], dueInDays: 25 },
	{ objectNumber: 'STC.1936.078', title: 'Squid, mantle opened', description: 'Gills and ink sac displayed.', department: ANA, location: 'SPR-A2', preservativeRecorded: 'alcohol (strength not recorded)', preservativeKind: 'ethanol', shape: 'oval', dims: [200, 120, 280], material: 'soda-lime', closure: 'glass-lid', seal: 'wax', hazards: [spirit], dueInDays: -200 },
	{ objectNumber: 'STC.1948.002', title: 'Rat, injected arterial system', description: 'Red latex injection; some fading of the latex.', department: ANA, location: 'SPR-A1', preservativeRecorded: '70% IMS', preservativeKind: 'industrial-spirit', shape: 'rectangular', dims: [150, 60, 240], material: 'soda-lime', closure: 'glass-lid', seal: 'silicone', hazards: [spirit], dueInDays: 180 },
	{ objectNumber: 'STC.1948.031', title: 'Starfish, oral surface', description: 'Dried once and rehydrated (old label).', department: ZOO, location: 'QRT-1', preservativeRecorded: 'unknown — no label', preservativeKind: 'unknown', shape: 'cylinder', dims: [150, null, 120], material: 'soda-lime', closure: 'glass-lid', seal: 'unknown', hazards: [hz('unknown-fluid', 'No record; treat as toxic and flammable until tested.')], dueInDays: -3 },
	{ objectNumber: 'STC.1952.140', title: 'Lung with anthracosis', description: 'Slice mounted in a thin rectangular jar.', department: PATH, location: 'FRM-1', preservativeRecorded: 'formalin then glycerol', preservativeKind: 'other', shape: 'rectangular', dims: [200, 30, 260], material: 'soda-lime', closure: 'glass-lid', seal: 'pitch', hazards: [hz('formaldehyde'), hz('coal-tar-pitch'), hz('arsenic', 'Historic preparation; arsenical additive possible per catalogue note.')], dueInDays: 60 },
	{ objectNumber: 'STC.1952.141', title: 'Gall bladder with stones', description: 'Opened; stones in a small glass cup.', department: PATH, location: 'FRM-1', preservativeRecorded: '10% formalin', preservativeKind: 'formalin', shape: 'cylinder', dims: [90, null, 140], material: 'soda-lime', closure: 'glass-lid', seal: 'silicone', hazards: [hz('formaldehyde')], dueInDays: 240 },
	{ objectNumber: 'STC.1960.009', title: 'Bat, wings spread', description: 'Wings pinned to a perspex sheet.', department: ZOO, location: 'SPR-B1', preservativeRecorded: '70% ethanol', preservativeKind: 'ethanol', shape: 'rectangular', dims: [230, 50, 180], material: 'acrylic', closure: 'snap-on', seal: 'gasket', hazards: [spirit], dueInDays: 30 },
	{ objectNumber: 'STC.1960.022', title: 'Hagfish, whole', description: 'Coiled; slime deposits on the base.', department: ZOO, location: 'SPR-B1', preservativeRecorded: 'IMS', preservativeKind: 'industrial-spirit', shape: 'cylinder', dims: [130, null, 170], material: 'soda-lime', closure: 'glass-lid', seal: 'silicone', hazards: [spirit], dueInDays: -45 },
	{ objectNumber: 'STC.1967.300', title: 'Sheep heart, coronary vessels dissected', description: 'Vessels picked out with coloured thread.', department: ANA, location: 'GAL-2', preservativeRecorded: '70% ethanol', preservativeKind: 'ethanol', shape: 'cylinder', dims: [130, null, 190], material: 'borosilicate', closure: 'glass-lid', seal: 'silicone', hazards: [spirit], dueInDays: 5 },
	{ objectNumber: 'STC.1967.301', title: 'Crayfish, appendages set out', description: 'Each appendage tied in order on a glass plate.', department: ZOO, location: 'SPR-A1', preservativeRecorded: '70% ethanol', preservativeKind: 'ethanol', shape: 'rectangular', dims: [170, 40, 210], material: 'soda-lime', closure: 'glass-lid', seal: 'wax', hazards: [spirit], dueInDays: 120 },
	{ objectNumber: 'STC.1974.055', title: 'Thyroid with goitre', description: 'Bisected, cut face to the front.', department: PATH, location: 'FRM-1', preservativeRecorded: 'formalin', preservativeKind: 'formalin', shape: 'oval', dims: [150, 100, 180], material: 'soda-lime', closure: 'glass-lid', seal: 'silicone', hazards: [hz('formaldehyde'), hz('damaged-glass', 'Chip on the rim at the back.')], dueInDays: -90 },
	{ objectNumber: 'STC.1974.060', title: 'Eel, migration stage', description: 'Glass eel stage; very small specimen on a thread.', department: ZOO, location: 'SPR-B1', preservativeRecorded: '80% ethanol', preservativeKind: 'ethanol', shape: 'cylinder', dims: [40, null, 110], material: 'borosilicate', closure: 'screw-cap', seal: 'gasket', hazards: [spirit], dueInDays: 365 },
	{ objectNumber: 'STC.1981.012', title: 'Lizard, skin shedding', description: 'Shed skin kept in the same jar on a second thread.', department: ZOO, location: 'SPR-A2', preservativeRecorded: '50% isopropanol', preservativeKind: 'propan-2-ol', shape: 'cylinder', dims: [70, null, 160], material: 'soda-lime', closure: 'screw-cap', seal: 'gasket', hazards: [spirit], dueInDays: 20 },
	{ objectNumber: 'STC.1989.204', title: 'Pig embryo, serial stages', description: 'Four embryos in a shallow rectangular jar.', department: ANA, location: 'SPR-A1', preservativeRecorded: '70% ethanol', preservativeKind: 'ethanol', shape: 'rectangular', dims: [190, 55, 150], material: 'acrylic', closure: 'snap-on', seal: 'gasket', hazards: [spirit, hz('damaged-glass', 'Acrylic crazed on the left face.')], dueInDays: 45 },
	{ objectNumber: 'STC.1995.018', title: 'Jellyfish, whole', description: 'Bell and tentacles; very fragile.', department: ZOO, location: 'QRT-1', preservativeRecorded: 'formalin-seawater (field)', preservativeKind: 'formalin', shape: 'cylinder', dims: [160, null, 200], material: 'soda-lime', closure: 'glass-lid', seal: 'unknown', hazards: [hz('formaldehyde'), hz('unknown-fluid', 'Field fluid; strength never measured.')], dueInDays: -10 },
	{ objectNumber: 'STC.2004.001', title: 'Trout, gill arches exposed', description: 'Operculum removed on the right side.', department: ANA, location: 'SPR-A2', preservativeRecorded: '70% ethanol', preservativeKind: 'ethanol', shape: 'oval', dims: [260, 110, 200], material: 'borosilicate', closure: 'glass-lid', seal: 'silicone', hazards: [spirit], dueInDays: null },
];
