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
				inner_height_mm: Math.round(60 + rnd() * 340),
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
