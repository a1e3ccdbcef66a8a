import type { Sequelize } from 'sequelize';
import { CLOSURE_TYPES, CONTAINER_MATERIALS, CONTAINER_SHAPES, HAZARD_FLAGS, PRESERVATIVE_KINDS, SEAL_TYPES } from '../../src/lib/specimen/vocabulary.ts';

/**
 * Many invented jars, for trying the register at the scale of a real store (`MENISCUS_SEED_LARGE`,
 * and the benchmark). Deterministic (a small linear congruential generator), so runs compare.
 */
const NOUNS = ['frog', 'newt', 'perch', 'crab', 'squid', 'lamprey', 'heart', 'kidney', 'lung', 'embryo', 'snail', 'leech', 'skate', 'mole', 'shrew'];
const VIEWS = ['whole', 'dissected', 'sagittal half', 'injected', 'opened', 'serial stages'];

export async function insertGenerated(sequelize: Sequelize, count: number, opts: { prefix?: string; today?: Date } = {}): Promise<number> {
	let seed = 20261201;
	const rnd = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
	const pick = <T>(xs: readonly T[]) => xs[Math.floor(rnd() * xs.length)]!;
	const today = opts.today ?? new Date();
	const prefix = opts.prefix ?? 'GEN';
	const [locs] = (await sequelize.query('SELECT id FROM storage_locations')) as [{ id: string }[], unknown];
	let done = 0;
	for (let start = 0; start < count; start += 1000) {
		const rows = [];
		for (let i = start; i < Math.min(count, start + 1000); i++) {
			const shape = pick(CONTAINER_SHAPES);
			const width = Math.round(40 + rnd() * 260);
			const height = Math.round(60 + rnd() * 340);
			rows.push({
				object_number: `${prefix}.${String(1850 + Math.floor(rnd() * 170))}.${String(i).padStart(5, '0')}`,
				title: `${pick(NOUNS)}, ${pick(VIEWS)}`,
				description: '',
				department: pick(['Zoology teaching series', 'Comparative anatomy', 'Pathology teaching series']),
				storage_location_id: locs.length ? pick(locs).id : null,
				preservative_recorded: '',
				preservative_kind: pick(PRESERVATIVE_KINDS),
				container_shape: shape,
				inner_width_mm: width,
				inner_depth_mm: shape === 'cylinder' ? null : Math.round(width * (0.3 + rnd() * 0.7)),
				inner_height_mm: height,
				specimen_top_mm: rnd() < 0.8 ? Math.round(height * (0.6 + rnd() * 0.25)) : null,
				container_material: pick(CONTAINER_MATERIALS),
				closure_type: pick(CLOSURE_TYPES),
				seal_type: pick(SEAL_TYPES),
				hazards: JSON.stringify(rnd() < 0.6 ? [{ flag: pick(HAZARD_FLAGS), note: '' }] : []),
				next_check_due: rnd() < 0.1 ? null : new Date(today.getTime() + (rnd() * 900 - 300) * 86_400_000).toISOString().slice(0, 10),
				version: 0,
				created_at: today,
				updated_at: today,
			});
		}
		await sequelize.getQueryInterface().bulkInsert('specimens', rows);
		done += rows.length;
	}
	return done;
}

/**
 * Approved condition checks for the generated jars (`perJar` each, a year or so apart, newest about
 * a month ago), so the overview's trends, store totals and airspace have work at scale: levels start
 * between 90 % and the lid and fall 0–6 mm a year, spirit is read at 15–24 °C. Needs a conservator and
 * a reviewer (the demo's). Deterministic, like the jars.
 */
export async function insertGeneratedChecks(sequelize: Sequelize, opts: { prefix?: string; perJar?: number; today?: Date } = {}): Promise<number> {
	let seed = 20261205;
	const rnd = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
	const today = (opts.today ?? new Date()).getTime();
	const perJar = opts.perJar ?? 3;
	const [people] = (await sequelize.query(`SELECT id, role FROM users WHERE role IN ('conservator', 'reviewer') ORDER BY role`)) as [{ id: string; role: string }[], unknown];
	const examiner = people.find((p) => p.role === 'conservator')!.id;
	const reviewer = people.find((p) => p.role === 'reviewer')!.id;
	const [jars] = (await sequelize.query(
		`SELECT id, inner_height_mm::float8 AS h, preservative_kind AS kind FROM specimens WHERE object_number LIKE :like ORDER BY object_number`,
		{ replacements: { like: `${opts.prefix ?? 'GEN'}.%` } },
	)) as [{ id: string; h: number; kind: string }[], unknown];
	const parts = JSON.stringify(Object.fromEntries(['container', 'lid', 'seal', 'fluid', 'specimen', 'mount', 'label'].map((p) => [p, { grade: 'good', terms: [], note: '' }])));
	const day = (t: number) => new Date(t).toISOString().slice(0, 10);
	let done = 0;
	for (let start = 0; start < jars.length; start += 300) {
		const rows = [];
		for (const j of jars.slice(start, start + 300)) {
			const rate = rnd() * 6;
			let level = j.h * (0.9 + rnd() * 0.1);
			const spirit = j.kind === 'ethanol' || j.kind === 'industrial-spirit';
			for (let k = perJar - 1; k >= 0; k--) {
				const at = today - (30 + k * (300 + rnd() * 130)) * 86_400_000;
				const tempC = Math.round((15 + rnd() * 9) * 10) / 10;
				rows.push({
					specimen_id: j.id,
					checked_on: day(at),
					examiner_id: examiner,
					reason: 'routine-survey',
					state: 'approved',
					parts,
					overall_grade: 'good',
					priority: 'none',
					notes: '',
					fluid: JSON.stringify({ readingPercentVol: null, tempC, glass: 'soda-lime', formaldehyde: 'not-tested', pH: null, levelMm: Math.round(level * 2) / 2, method: '', realPercentVol: spirit ? 65 + rnd() * 10 : null }),
					submitted_at: new Date(at + 3_600_000),
					reviewer_id: reviewer,
					reviewed_at: new Date(at + 86_400_000),
					version: 0,
					created_at: new Date(at),
					updated_at: new Date(at + 86_400_000),
				});
				level = Math.max(0, level - rate * (0.8 + rnd() * 0.4));
			}
		}
		await sequelize.getQueryInterface().bulkInsert('condition_checks', rows);
		done += rows.length;
	}
	return done;
}
