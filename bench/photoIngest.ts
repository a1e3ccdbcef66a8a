// Photo ingest: what the worker does per photo minus the database (inspect, SHA-256, EXIF, then the
// thumbnail, display copy and IIIF tile pyramid from one decode), on an invented 24 MP and 60 MP
// JPEG, with 1 libvips thread (the worker default) and with all cores. Baseline in the same run:
// ImageMagick making the same outputs from the same file in one `convert`. Each measurement is a
// child process, so that peak memory is read the same way for both (GNU time's maximum RSS).
// Prints medians and ratios to the baseline. Run: `npm run bench -- photos`.
// Settings: BENCH_PHOTO_REPEATS (ImageMagick, default 3), BENCH_PHOTO_MENISCUS_REPEATS (default 5),
// BENCH_PHOTO_SIZES ("24 MP,60 MP"), BENCH_IM_DEFAULT_POLICY=1 also times ImageMagick under
// Debian's own resource limits.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { spawnSync } from 'node:child_process';
import sharp from 'sharp';
import { DISPLAY_LONG_EDGE, THUMBNAIL_LONG_EDGE, TILE_SIZE } from '../src/lib/photos/limits.ts';
import { testImages, SIZES, type SizeName, type TestImage } from '../tests/helpers/testImages.ts';
import { ensureGnuTime, ensureImageMagick, measure, type Measured } from './lib/tools.ts';
import { emitPart, mb, median, ms, ratio, seconds, table, emitHeadline } from './lib/report.ts';
import type { RunResult } from './photoIngestRun.ts';

const root = path.resolve(import.meta.dirname, '..');
const IM_REPEATS = Math.max(3, Number(process.env.BENCH_PHOTO_REPEATS ?? 3));
const M_REPEATS = Math.max(IM_REPEATS, Number(process.env.BENCH_PHOTO_MENISCUS_REPEATS ?? 5));
const SIZE_NAMES = (process.env.BENCH_PHOTO_SIZES ?? Object.keys(SIZES).join(','))
	.split(',')
	.map((s) => s.trim())
	.filter((s): s is SizeName => s in SIZES);
const IM_DEFAULT_POLICY = process.env.BENCH_IM_DEFAULT_POLICY === '1';
const CORES = os.availableParallelism();
const THREADS = CORES > 1 ? [1, CORES] : [1];
const log = (m: string) => console.log(`[photos] ${m}`);

/** The resource limits that the bench's own policy.xml raises (only these; every other policy stays). */
const RAISED = { memory: '8GiB', map: '16GiB', area: '2GP', disk: '32GiB' } as const;

const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'meniscus-bench-photos-'));
const runner = path.join(root, 'bench', 'photoIngestRun.ts');

/** As many pyramid levels as libvips writes: halve until the level fits in one tile. */
function levelsFor(width: number, height: number): number {
	let n = 1;
	while (Math.ceil(Math.max(width, height) / 2 ** (n - 1)) > TILE_SIZE) n++;
	return n;
}

function tilesPerLevel(width: number, height: number, levels: number): number[] {
	const out: number[] = [];
	for (let l = 0, w = width, h = height; l < levels; l++, w = Math.round(w / 2), h = Math.round(h / 2)) out.push(Math.ceil(w / TILE_SIZE) * Math.ceil(h / TILE_SIZE));
	return out;
}

/**
 * ImageMagick's equivalent of makeDerivatives in one command: read and decode once, upright, sRGB,
 * no metadata; the thumbnail and display copy from clones of the full raster; then the 512 px tiles
 * of the full raster, halve, tile again, down to the level that fits in one tile (IM 6 has no IIIF
 * layout; one file per tile and the same levels and tile count is the honest equivalent). Quality
 * and chroma subsampling as Meniscus writes them (thumbnail 80/4:2:0, display 86/4:4:4, tiles 84/4:2:0).
 */
function imArgs(master: string, out: string, levels: number, threads: number): string[] {
	const a = ['-limit', 'thread', String(threads), ...Object.entries(RAISED).flatMap(([k, v]) => ['-limit', k, v])];
	a.push(master, '-auto-orient', '-background', 'white', '-alpha', 'remove', '-colorspace', 'sRGB', '-strip');
	const copy = (edge: number, quality: number, sampling: string, file: string) => ['(', '+clone', '-resize', `${edge}x${edge}>`, '-quality', String(quality), '-sampling-factor', sampling, '-write', path.join(out, file), '-delete', '0--1', ')'];
	a.push(...copy(THUMBNAIL_LONG_EDGE, 80, '2x2', 'thumbnail.jpg'), ...copy(DISPLAY_LONG_EDGE, 86, '1x1', 'display.jpg'));
	a.push('-quality', '84', '-sampling-factor', '2x2');
	for (let l = 0; l < levels; l++) {
		if (l > 0) a.push('-resize', '50%');
		// -scene 0 numbers each level's tiles from 0; -delete 0--1 drops all of them, not just the last.
		a.push('(', '+clone', '-crop', `${TILE_SIZE}x${TILE_SIZE}`, '+repage', '-scene', '0', '+adjoin', '-write', path.join(out, 'tiles', `${l}-%03d.jpg`), '-delete', '0--1', ')');
	}
	a.push('null:');
	return a;
}

interface Limits {
	memory: string;
	map: string;
	area: string;
	disk: string;
}

function resourceLimits(convert: string, extra: string[] = [], env: NodeJS.ProcessEnv = process.env): Limits {
	const r = spawnSync(convert, [...extra, '-list', 'resource'], { encoding: 'utf8', env });
	const get = (name: string) => new RegExp(`^\\s*${name}:\\s*(\\S+)`, 'mi').exec(r.stdout)?.[1] ?? '?';
	return { memory: get('Memory'), map: get('Map'), area: get('Area'), disk: get('Disk') };
}

/** Where the master's pixel cache lives (heap, memory map, disk), from `-debug cache`. */
function cachePlaces(convert: string, master: string, env: NodeJS.ProcessEnv): string {
	const r = spawnSync(convert, ['-debug', 'cache', master, '+clone', 'null:'], { encoding: 'utf8', env, maxBuffer: 64 * 1024 * 1024 });
	const places = [...`${r.stderr}${r.stdout}`.matchAll(/^\s*open \S+ \((?:[^,]*,\s*)?(Heap Memory|Anonymous Memory|Map|Disk|Distributed)[^)]*?(\d+x\d+) ([\d.]+\w+)\)/gm)]
		.map((m) => ({ kind: m[1]!, size: m[2]!, bytes: m[3]! }))
		.filter((p) => Number(p.size.split('x')[0]) >= 1000);
	const disk = /\bdisk\b/i.test(r.stderr) ? ' (backed by a file in the temp folder)' : '';
	return places.length ? places.map((p) => `${p.kind} ${p.size} ${p.bytes}`).join(', ') + disk : 'unknown';
}

interface Sample {
	wallMs: number;
	maxRssKb: number | null;
}

function meniscusRun(image: TestImage, threads: number, i: number): Sample & { result: RunResult } {
	const setDir = path.join(tmp, 'out', `meniscus-${i}`);
	fs.mkdirSync(path.dirname(setDir), { recursive: true });
	const m = measure(gnuTime, process.execPath, ['--import', 'tsx', runner, 'ingest', image.file, String(threads), setDir], { cwd: root });
	fs.rmSync(setDir, { recursive: true, force: true });
	if (m.status !== 0) throw new Error(`Meniscus run failed (${m.status}): ${m.stderr.trim().slice(-800)}`);
	const result = JSON.parse(m.stdout.trim().split('\n').pop()!) as RunResult;
	return { wallMs: m.wallMs, maxRssKb: m.maxRssKb, result };
}

interface ImOutputs {
	tilesPerLevel: number[];
	thumbnail: string;
	display: string;
	tileBytes: number;
	displayBytes: number;
}

async function imRun(convert: string, image: TestImage, levels: number, threads: number, i: number, env: NodeJS.ProcessEnv): Promise<Sample & { outputs: ImOutputs }> {
	const out = path.join(tmp, 'out', `im-${i}`);
	fs.mkdirSync(path.join(out, 'tiles'), { recursive: true });
	const m: Measured = measure(gnuTime, convert, imArgs(image.file, out, levels, threads), { env });
	if (m.status !== 0) throw new Error(`ImageMagick failed (${m.status}): ${m.stderr.trim().slice(-800)}`);
	const tiles = fs.readdirSync(path.join(out, 'tiles'));
	const perLevel = Array.from({ length: levels }, (_, l) => tiles.filter((t) => t.startsWith(`${l}-`)).length);
	const size = async (f: string) => {
		const meta = await sharp(f).metadata();
		return `${meta.width}x${meta.height}`;
	};
	const outputs: ImOutputs = {
		tilesPerLevel: perLevel,
		thumbnail: await size(path.join(out, 'thumbnail.jpg')),
		display: await size(path.join(out, 'display.jpg')),
		tileBytes: tiles.reduce((s, t) => s + fs.statSync(path.join(out, 'tiles', t)).size, 0),
		displayBytes: fs.statSync(path.join(out, 'display.jpg')).size,
	};
	fs.rmSync(out, { recursive: true, force: true });
	return { wallMs: m.wallMs, maxRssKb: m.maxRssKb, outputs };
}

const medianOf = <T,>(xs: readonly T[], f: (s: T) => number | null) => {
	const v = xs.map(f).filter((x): x is number => x !== null);
	return v.length ? median(v) : Number.NaN;
};

let gnuTime: string | null = null;

try {
	const t0 = performance.now();
	const images = await testImages(path.join(tmp, 'images'), SIZE_NAMES);
	log(`made ${images.map((i) => `${i.name} (${(i.bytes / 1e6).toFixed(1)} MB)`).join(' and ')} in ${seconds(performance.now() - t0)} s`);
	gnuTime = ensureGnuTime(log);
	const im = ensureImageMagick(log);
	if (!im.ok) log(im.why);

	// ImageMagick's resource limits: Debian's policy.xml keeps the pixel cache small, and `-limit`
	// can only lower a policy limit, never raise it (policy values are maximums). So the bench brings
	// its own policy.xml that raises only memory, map, area and disk, found first through
	// MAGICK_CONFIGURE_PATH; Debian's other policies (coders, paths) still apply.
	const policyDir = path.join(tmp, 'imagemagick-policy');
	fs.mkdirSync(policyDir);
	fs.writeFileSync(path.join(policyDir, 'policy.xml'), `<policymap>\n${Object.entries(RAISED).map(([k, v]) => `  <policy domain="resource" name="${k}" value="${v}"/>`).join('\n')}\n</policymap>\n`);
	const raisedEnv = { ...process.env, MAGICK_CONFIGURE_PATH: policyDir };
	const limitNotes: string[] = [];
	if (im.ok) {
		const debian = resourceLimits(im.convert);
		const withLimitFlags = resourceLimits(im.convert, Object.entries(RAISED).flatMap(([k, v]) => ['-limit', k, v]));
		const raised = resourceLimits(im.convert, [], raisedEnv);
		limitNotes.push(
			`Debian's limits (\`convert -list resource\`): memory ${debian.memory}, map ${debian.map}, area ${debian.area}, disk ${debian.disk}.`,
			`With \`-limit memory ${RAISED.memory} -limit map ${RAISED.map} …\` on the command line: memory ${withLimitFlags.memory}, map ${withLimitFlags.map}${withLimitFlags.memory === debian.memory ? ' — unchanged: policy.xml values are maximums, and `-limit` can only lower them' : ''}.`,
			`With the bench's own policy.xml (MAGICK_CONFIGURE_PATH) and the same \`-limit\` options: memory ${raised.memory}, map ${raised.map}, area ${raised.area}, disk ${raised.disk}. The baseline runs this way, so that its pixel cache stays in memory as libvips's does.`,
		);
		for (const image of images) {
			// ImageMagick 6 Q16 keeps 8 bytes a pixel (four 16-bit samples) in its pixel cache.
			const need = (image.width * image.height * 8) / 2 ** 20;
			// (+clone shares the master's cache until it is changed, and every output is a new, smaller image.)
			const places = cachePlaces(im.convert, image.file, process.env);
			limitNotes.push(`${image.name}: the master's pixel cache is ${need.toFixed(0)} MiB; under Debian's limits it is held in ${places}${/Map|Disk/.test(places) ? ' — over the memory limit, so not in memory' : ''}; with the raised limits in ${cachePlaces(im.convert, image.file, raisedEnv)}.`);
		}
	}

	// The floor: a child that loads the same modules and does nothing (Node, tsx, sharp).
	measure(gnuTime, process.execPath, ['--import', 'tsx', runner, 'noop'], { cwd: root }); // warms tsx's cache
	const floor: Sample[] = [];
	for (let r = 0; r < M_REPEATS; r++) floor.push(measure(gnuTime, process.execPath, ['--import', 'tsx', runner, 'noop'], { cwd: root }));

	const sections: string[] = [];
	const summary: string[][] = [];
	let n = 0;
	for (const image of images) {
		const levels = levelsFor(image.width, image.height);
		const m = new Map<number, (Sample & { result: RunResult })[]>(THREADS.map((t) => [t, []]));
		const b = new Map<number, (Sample & { outputs: ImOutputs })[]>(THREADS.map((t) => [t, []]));
		const bDefault: Sample[] = [];
		// Interleaved, so that a slow spell of the machine touches every contender alike.
		for (let r = 0; r < M_REPEATS; r++) {
			for (const t of THREADS) {
				const s = meniscusRun(image, t, n++);
				m.get(t)!.push(s);
				log(`${image.name} Meniscus ${t} thread(s) #${r + 1}: ${seconds(s.result.total)} s in-process, ${seconds(s.wallMs)} s process, ${mb(s.maxRssKb)} MB peak`);
			}
			if (!im.ok || r >= IM_REPEATS) continue;
			for (const t of [...THREADS].reverse()) {
				const s = await imRun(im.convert, image, levels, t, n++, raisedEnv);
				b.get(t)!.push(s);
				log(`${image.name} ImageMagick ${t} thread(s) #${r + 1}: ${seconds(s.wallMs)} s, ${mb(s.maxRssKb)} MB peak`);
			}
			if (IM_DEFAULT_POLICY) {
				const s = await imRun(im.convert, image, levels, CORES, n++, process.env);
				bDefault.push(s);
				log(`${image.name} ImageMagick under Debian's limits #${r + 1}: ${seconds(s.wallMs)} s`);
			}
		}

		// The outputs must match in kind, size and count, or the comparison means nothing.
		const first = m.get(1)![0]!.result;
		const expected = tilesPerLevel(image.width, image.height, levels);
		const meniscusTiles = first.tiles;
		const kinds = Object.fromEntries(first.outputs.map((o) => [o.kind, `${o.width}x${o.height}`]));
		if (first.scaleFactors.length !== levels) throw new Error(`${image.name}: libvips wrote ${first.scaleFactors.length} levels, the baseline assumes ${levels}`);
		if (meniscusTiles !== expected.reduce((s, x) => s + x, 0)) throw new Error(`${image.name}: libvips wrote ${meniscusTiles} tiles, expected ${expected.join('+')}`);
		const imOut = im.ok ? b.get(CORES)![0]!.outputs : null;
		if (imOut && imOut.tilesPerLevel.join() !== expected.join()) throw new Error(`${image.name}: ImageMagick wrote ${imOut.tilesPerLevel.join('+')} tiles, expected ${expected.join('+')}`);

		const mTotal = (t: number) => medianOf(m.get(t)!, (s) => s.result.total);
		const mWall = (t: number) => medianOf(m.get(t)!, (s) => s.wallMs);
		const mRss = (t: number) => medianOf(m.get(t)!, (s) => s.maxRssKb);
		const bWall = (t: number) => (im.ok ? medianOf(b.get(t)!, (s) => s.wallMs) : Number.NaN);
		const bRss = (t: number) => (im.ok ? medianOf(b.get(t)!, (s) => s.maxRssKb) : Number.NaN);
		const base = bWall(CORES);
		const rows: string[][] = [];
		for (const t of [...THREADS].reverse()) rows.push([`ImageMagick \`convert\`, ${t} thread${t > 1 ? 's' : ''}${t === CORES ? ' (**baseline**)' : ''}`, seconds(bWall(t)), ratio(bWall(t), bWall(t)), ratio(bWall(t), base), mb(bRss(t)), ratio(bRss(t), bRss(CORES))]);
		if (IM_DEFAULT_POLICY && bDefault.length) rows.push([`ImageMagick, ${CORES} threads, Debian's own limits`, seconds(medianOf(bDefault, (s) => s.wallMs)), '', ratio(medianOf(bDefault, (s) => s.wallMs), base), mb(medianOf(bDefault, (s) => s.maxRssKb)), ratio(medianOf(bDefault, (s) => s.maxRssKb), bRss(CORES))]);
		for (const t of THREADS) {
			rows.push([`Meniscus pipeline, ${t} thread${t > 1 ? 's' : ''}${t === 1 ? ' (worker default)' : ''}`, seconds(mTotal(t)), ratio(mTotal(t), bWall(t)), ratio(mTotal(t), base), mb(mRss(t)), ratio(mRss(t), bRss(CORES))]);
			rows.push([`… the same, whole child process (Node start-up included)`, seconds(mWall(t)), ratio(mWall(t), bWall(t)), ratio(mWall(t), base), '', '']);
		}
		const floorRss = medianOf(floor, (s) => s.maxRssKb);
		rows.push(['Node + tsx + sharp loaded, doing nothing (floor)', seconds(medianOf(floor, (s) => s.wallMs)), '', ratio(medianOf(floor, (s) => s.wallMs), base), mb(floorRss), ratio(floorRss, bRss(CORES))]);

		const stageRows: string[][] = [];
		for (const t of THREADS) {
			const runs = m.get(t)!.map((s) => s.result);
			for (const stage of ['inspect', 'hash', 'exif', 'derivatives'] as const) {
				const v = median(runs.map((r) => r.stages[stage]));
				stageRows.push([`${t}`, stage === 'hash' ? 'SHA-256' : stage === 'exif' ? 'EXIF' : stage, ms(v), ratio(v, mTotal(t)), ratio(v, bWall(t))]);
			}
			stageRows.push([`${t}`, '**total**', ms(mTotal(t)), '1.00×', ratio(mTotal(t), bWall(t))]);
		}

		const equivalence = table(
			['output', 'Meniscus (libvips)', 'ImageMagick'],
			[
				['thumbnail', kinds.thumbnail ?? '?', imOut?.thumbnail ?? 'n/a'],
				['display copy', `${kinds.display ?? '?'}, ${first.outputs.find((o) => o.kind === 'display')?.byteSize.toLocaleString('en-GB')} B`, imOut ? `${imOut.display}, ${imOut.displayBytes.toLocaleString('en-GB')} B` : 'n/a'],
				['tile levels (scale factors)', first.scaleFactors.join(', '), imOut ? `${imOut.tilesPerLevel.length} (full size, then halved ${imOut.tilesPerLevel.length - 1}×)` : 'n/a'],
				['tiles per level', `${expected.join(' + ')} = ${meniscusTiles}`, imOut ? `${imOut.tilesPerLevel.join(' + ')} = ${imOut.tilesPerLevel.reduce((s, x) => s + x, 0)} (${(imOut.tileBytes / 1e6).toFixed(1)} MB)` : 'n/a'],
			],
		);
		sections.push(
			[
				`### ${image.name}: ${image.width} × ${image.height} JPEG, ${(image.bytes / 1e6).toFixed(1)} MB (invented, quality 92)`,
				'',
				`Medians: Meniscus over ${M_REPEATS} runs, ImageMagick over ${im.ok ? IM_REPEATS : 0}. Meniscus's time is measured inside the child around the four stages (what a running worker spends per photo); the next row is the whole child process including Node's start-up. ImageMagick's is the whole \`convert\` process. Peak memory is GNU time's maximum resident set size of the child, for both.`,
				'',
				table(['', 'wall (s)', '× ImageMagick, same threads', '× baseline', 'peak RSS (MB)', '× baseline RSS'], rows),
				'',
				`Stages of the Meniscus pipeline (medians, ms):`,
				'',
				table(['threads', 'stage', 'ms', '× Meniscus total', '× ImageMagick, same threads'], stageRows),
				'',
				'Outputs (first run of each; checked equal in kind, size and number of tiles):',
				'',
				equivalence,
			].join('\n'),
		);
		for (const t of THREADS) {
			const r = mTotal(t) / bWall(t);
			emitHeadline({ label: `photo ingest, ${image.name}, ${t} thread${t > 1 ? 's' : ''}: ÷ ImageMagick`, ratio: r, target: { value: 0.8, better: 'lower' } });
			summary.push([image.name, `${t}`, seconds(mTotal(t)), seconds(bWall(t)), ratio(mTotal(t), bWall(t)), Number.isFinite(r) ? `${r <= 0.8 ? 'met' : '**missed**'} (${r.toFixed(3)}×)` : 'n/a', `${mb(mRss(t))} / ${mb(bRss(t))}`]);
		}
	}

	emitPart(
		[
			'## Photo ingest: Meniscus pipeline against ImageMagick',
			'',
			'Per photo, what the worker does minus the database: `inspect` (bytes and header), `sha256File`, `readExif`, `makeDerivatives` (thumbnail 400 px, display copy 2048 px, IIIF tile pyramid of 512 px tiles, from one decode), after `configureSharp(threads)`. Baseline in the same run: ImageMagick making the same outputs from the same file in one `convert` (decode once; thumbnail and display copy from clones; 512 px tiles of the full raster, then halved and tiled again down to one tile: the same levels and number of tiles as the IIIF pyramid). Target from the issue: Meniscus at or below 0.8× ImageMagick.',
			'',
			table(['image', 'threads', 'Meniscus (s)', 'ImageMagick (s)', 'Meniscus / ImageMagick', 'target ≤ 0.8×', 'peak RSS MB (Meniscus / ImageMagick)'], summary),
			'',
			im.ok ? `ImageMagick: ${im.version} (\`${im.convert}\`), run as (for the ${images[0]?.name ?? ''} image, ${CORES} threads):` : `ImageMagick: ${im.why}`,
			'',
			...(im.ok && images[0] ? ['```sh', `convert ${imArgs('master.jpg', 'out', levelsFor(images[0].width, images[0].height), CORES).map((a) => (/[()>%]/.test(a) ? `'${a}'` : a)).join(' ')}`, '```', ''] : []),
			...limitNotes.map((l) => `- ${l}`),
			'',
			...sections.map((section) => `${section}\n`),
		].join('\n'),
	);
} finally {
	fs.rmSync(tmp, { recursive: true, force: true });
}
