import crypto from 'node:crypto';
import fsp from 'node:fs/promises';
import { QueryTypes, type Sequelize } from 'sequelize';
import { renderJarPhoto, type JarShape, type SealKind, type SpecimenSilhouette } from './photos/drawJar.ts';
import { PhotoUpload } from '../../src/lib/server/models/index.ts';
import { db } from '../../src/lib/server/db.ts';
import { ensureDirs } from '../../src/lib/server/photos/storage.ts';
import { incomingFile } from '../../src/lib/server/photos/incoming.ts';
import { ingestUpload } from '../../src/lib/server/photos/ingest.ts';
import { stageForReason } from '../../src/lib/photos/uploadPolicy.ts';
import type { Grade, Part } from '../../src/lib/check/vocabulary.ts';
import { demoLayer } from './demoMarks.ts';

/**
 * Photographs for the demo checks, drawn rather than photographed (db/seeders/photos/drawJar.ts):
 * each check gets a front view of its jar at the fluid level that check recorded, the fluid
 * darkening with the years, a scale bar and a grey card in frame; the latest check of some jars
 * also gets a view of the lid. Each front view carries marks (demoMarks.ts): the scale bar, a grey
 * reference, the levels and the damage its check found. They enter exactly as an upload does (an upload record, the bytes in
 * incoming/, then the worker's own ingest), so the demo shows the real pipeline's results.
 * Needs DATABASE_URL and MENISCUS_UPLOADS_DIR set for the server modules.
 */
interface CheckRow {
	check_id: string;
	specimen_id: string;
	object_number: string;
	title: string;
	preservative_kind: string;
	container_shape: string;
	seal_type: string;
	inner_height_mm: number;
	checked_on: string;
	reason: string;
	examiner_id: string;
	level_mm: number | null;
	parts: Record<Part, { grade: Grade | null; terms: string[]; note: string }>;
	n: number;
	of: number;
}

const SILHOUETTES: [RegExp, SpecimenSilhouette][] = [
	[/frog|toad|newt|axolotl/i, 'frog'],
	[/snake|eel|lamprey|hagfish|worm|tapeworm/i, 'snake'],
	[/octopus|squid|cuttle|jellyfish|starfish/i, 'cephalopod'],
	[/heart|kidney|lung|liver|thyroid|brain|gall|organ|stomach|fetal/i, 'organ'],
	[/fish|dogfish|trout|seahorse|shark|ray/i, 'fish'],
];

const silhouetteOf = (title: string): SpecimenSilhouette => SILHOUETTES.find(([re]) => re.test(title))?.[1] ?? 'generic';
const sealOf = (s: string): SealKind => (s === 'pitch' || s === 'wax' || s === 'silicone' ? s : 'none');
const shapeOf = (s: string): JarShape => (s === 'rectangular' || s === 'oval' ? s : 'cylinder');

/** Fluid colour: spirit yellows towards amber as extractives build up over the years, formalin stays paler. */
function fluidColour(kind: string, ageYears: number, seed: number): [number, number, number] {
	const pale: [number, number, number] = kind === 'formalin' ? [236, 236, 222] : [240, 228, 176];
	const dark: [number, number, number] = kind === 'formalin' ? [214, 196, 140] : kind === 'unknown' ? [150, 120, 70] : [182, 116, 44];
	const t = Math.min(1, Math.max(0, 0.12 + (seed % 7) * 0.05 + ageYears * 0.09));
	return pale.map((p, i) => Math.round(p + (dark[i]! - p) * t)) as [number, number, number];
}

/** The offset a camera set to local time would write (a summer-time rule, invented for the demo). */
const offsetFor = (date: string) => {
	const m = Number(date.slice(5, 7));
	return m >= 4 && m <= 10 ? '+01:00' : '+00:00';
};

/** The jar whose seal crack grows between its last two checks (in review): the demo's before-and-after. */
export const COMPARE_SHOWCASE = 'STC.1898.014';

/** Where the tripod stood at this check: up to 6 % closer and 40 px off, different each time (invented). */
function cameraFor(checkId: string) {
	const h = crypto.createHash('sha256').update(`camera:${checkId}`).digest();
	return { zoom: 1 + (h[0]! % 61) / 1000, dx: (h[1]! % 81) - 40, dy: (h[2]! % 81) - 40 };
}

/** `latest`: only each jar's most recent check (the tests use it to keep their set-up short). */
export async function seedDemoPhotos(sequelize: Sequelize, opts: { parallel?: number; scope?: 'all' | 'latest'; log?: (m: string) => void } = {}): Promise<number> {
	// The ingest code works through the server's own connection (DATABASE_URL), as the worker does.
	db();
	ensureDirs();
	const rows = await sequelize.query<CheckRow>(
		`SELECT c.id AS check_id, s.id AS specimen_id, s.object_number, s.title, s.preservative_kind, s.container_shape, s.seal_type,
		        s.inner_height_mm::float AS inner_height_mm, c.checked_on::text AS checked_on, c.reason, c.examiner_id, (c.fluid->>'levelMm')::float AS level_mm, c.parts,
		        row_number() OVER (PARTITION BY s.id ORDER BY c.checked_on) AS n, count(*) OVER (PARTITION BY s.id) AS of
		 FROM condition_checks c JOIN specimens s ON s.id = c.specimen_id ORDER BY s.object_number, c.checked_on`,
		{ type: QueryTypes.SELECT },
	);
	const first = new Map<string, string>();
	for (const r of rows) if (!first.has(r.specimen_id)) first.set(r.specimen_id, r.checked_on);
	// The showcase jar keeps its last two checks even in `latest`, so there is always a pair to compare.
	const chosen = opts.scope === 'latest' ? rows.filter((r) => Number(r.n) === Number(r.of) || (r.object_number === COMPARE_SHOWCASE && Number(r.n) === Number(r.of) - 1)) : rows;
	const jobs = chosen.flatMap((r) => {
		const views: ('front' | 'top')[] = Number(r.n) === Number(r.of) && r.object_number.charCodeAt(r.object_number.length - 1) % 3 === 0 ? ['front', 'top'] : ['front'];
		return views.map((view) => ({ r, view }));
	});
	const one = async ({ r, view }: (typeof jobs)[number]) => {
		const seed = parseInt(crypto.createHash('sha256').update(r.object_number).digest('hex').slice(0, 8), 16);
		const ageYears = (Date.parse(r.checked_on) - Date.parse(first.get(r.specimen_id)!)) / (365.25 * 86_400_000) + (seed % 5);
		const fill = r.level_mm !== null && r.inner_height_mm > 0 ? r.level_mm / r.inner_height_mm : 0.9;
		const hour = 9 + (seed % 7);
		const { jpeg, truth } = await renderJarPhoto({
			seed,
			shape: shapeOf(r.container_shape),
			silhouette: silhouetteOf(r.title),
			seal: sealOf(r.seal_type),
			objectNumber: r.object_number,
			fluidFill: Math.min(1, Math.max(0, fill)),
			fluidColour: fluidColour(r.preservative_kind, ageYears, seed),
			specimenTopFraction: 0.7 + (seed % 10) / 100,
			captureTime: { local: `${r.checked_on.replaceAll('-', ':')} ${String(hour).padStart(2, '0')}:${String(seed % 60).padStart(2, '0')}:05`, offset: offsetFor(r.checked_on) },
			view,
			camera: cameraFor(r.check_id),
		});
		const id = crypto.createHash('sha256').update(`demo-photo:${r.check_id}:${view}`).digest('hex').slice(0, 32);
		await fsp.writeFile(incomingFile(id), jpeg);
		await PhotoUpload.create({
			id,
			specimenId: r.specimen_id,
			checkId: r.check_id,
			view,
			stage: stageForReason(r.reason),
			fileName: `${r.object_number} ${view} ${r.checked_on}.jpg`,
			declaredType: 'image/jpeg',
			declaredSize: jpeg.length,
			clientSha256: crypto.createHash('sha256').update(jpeg).digest('hex'),
			uploaderId: r.examiner_id,
			refusalCode: null,
			reason: null,
			photoId: null,
			finishedAt: new Date(`${r.checked_on}T${String(hour + 1).padStart(2, '0')}:00:00Z`),
		});
		// Uploaded on the day of the check, as it would have been.
		await sequelize.query(`UPDATE photo_uploads SET created_at = finished_at WHERE id = :id`, { replacements: { id } });
		const outcome = await ingestUpload(id);
		if (outcome.state !== 'recorded') throw new Error(`demo photo ${id} not recorded: ${JSON.stringify(outcome)}`);
		if (view === 'front') {
			const layer = demoLayer(truth, r.parts, r.examiner_id, new Date(`${r.checked_on}T${String(hour + 1).padStart(2, '0')}:00:00Z`).toISOString(), Number(r.of) > 1 ? (Number(r.n) - 1) / (Number(r.of) - 1) : 1);
			await sequelize.transaction(async (transaction) => {
				// Many demo checks are created already approved; the seeder may still write their marks.
				await sequelize.query(`SET LOCAL meniscus.seeding = 'on'`, { transaction });
				await sequelize.query(`INSERT INTO mark_layers (photo_id, layer, mark_count, version, updated_by, created_at, updated_at) VALUES (:photoId, :layer, :n, 1, :by, :at, :at)`, {
					replacements: { photoId: outcome.photoId, layer: JSON.stringify(layer), n: layer.marks.length, by: r.examiner_id, at: layer.marks[0]!.createdAt },
					transaction,
				});
			});
		}
	};
	// A small pool: rendering and ingesting are CPU-bound, two at a time suits the usual two cores.
	const queue = [...jobs];
	const parallel = opts.parallel ?? 2;
	await Promise.all(Array.from({ length: parallel }, async () => {
		for (let job = queue.shift(); job; job = queue.shift()) await one(job);
	}));
	opts.log?.(`Drew and recorded ${jobs.length} demo photographs.`);
	return jobs.length;
}
