// The mark-up canvas under load: one invented 60 MP photograph (9504 × 6336) uploaded through the
// real app and prepared by the real photo worker, then (a) the save round trip of its mark layer,
// PUT then GET, with 1,000 marks against an empty layer, and (b) the frame rate of scripted zoom
// and pan on /photos/<id>/marks in headless Chromium, with no marks against 1,000 marks. Baselines
// are measured in the same run and interleaved with what they are compared with. Run:
// `npm run bench -- canvas`. Settings: BENCH_CANVAS_SAVES (7), BENCH_CANVAS_RUNS (3),
// BENCH_CANVAS_SECONDS (4), BENCH_SERVER_LOG=1 shows the app's and the worker's log.
import path from 'node:path';
import { chromium, type BrowserContext } from 'playwright-core';
import { DEFAULT_TERMS, PARTS, type Part } from '../src/lib/check/vocabulary.ts';
import { MARK_SCHEMA_VERSION, MarkLayerSchema, type Mark, type MarkLayer, type Point } from '../src/lib/marks/schema.ts';
import { emitPart, median, ratio, table, emitHeadline } from './lib/report.ts';
import { signIn, tusUpload } from './lib/appClient.ts';
import { createSpecimen, startAppStack, type AppStack } from './lib/appStack.ts';
import { demoPassword } from '../db/seeders/demoPassword.mjs';
import { testImages } from '../tests/helpers/testImages.ts';
import { CHROMIUM, ensureChromium } from '../scripts/lib/chromium.mjs';

const root = path.resolve(import.meta.dirname, '..');
const SAVES = Math.max(5, Number(process.env.BENCH_CANVAS_SAVES ?? 7));
const RUNS = Math.max(3, Number(process.env.BENCH_CANVAS_RUNS ?? 3));
const SECONDS = Math.max(2, Number(process.env.BENCH_CANVAS_SECONDS ?? 4));
const MARKS = 1000;
const log = (m: string) => console.log(`[canvas] ${m}`);


/** mulberry32: the same invented layer every run, so runs measure the same marks. */
function rng(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) | 0;
		let t = Math.imul(a ^ (a >>> 15), 1 | a);
		t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

/**
 * 1,000 damage marks spread over the photo: outlines (8–40 vertices, a jittered regular polygon,
 * so angles only increase and it never crosses itself), paths (5–30 points of a random walk), pins
 * and boxes, each with a part and one of its default terms, as a conservator would leave them.
 */
function inventLayer(width: number, height: number, authorId: string): MarkLayer {
	const r = rng(60_000_000);
	const between = (lo: number, hi: number) => lo + r() * (hi - lo);
	const int = (lo: number, hi: number) => Math.floor(between(lo, hi + 1));
	const round = (v: number) => Math.round(v * 10) / 10;
	const clampX = (x: number) => round(Math.min(width - 1, Math.max(0, x)));
	const clampY = (y: number) => round(Math.min(height - 1, Math.max(0, y)));
	const t0 = Date.parse('2026-03-14T10:00:00Z');
	const marks: Mark[] = [];
	for (let i = 0; i < MARKS; i++) {
		const part = PARTS[int(0, PARTS.length - 1)] as Part;
		const terms = DEFAULT_TERMS[part];
		const time = new Date(t0 + i * 7_000).toISOString();
		const base = { id: `bench-${i.toString().padStart(4, '0')}`, authorId, createdAt: time, updatedAt: time, part, term: terms[int(0, terms.length - 1)]!, severity: int(1, 3) as 1 | 2 | 3, note: i % 10 === 0 ? 'Invented for the canvas benchmark.' : '' };
		const cx = between(200, width - 200);
		const cy = between(200, height - 200);
		const kind = i % 10 < 4 ? 'outline' : i % 10 < 7 ? 'path' : i % 10 < 9 ? 'pin' : 'box';
		if (kind === 'outline') {
			const n = int(8, 40);
			const radius = between(40, 180);
			const points: Point[] = [];
			for (let k = 0; k < n; k++) {
				const a = ((k + between(-0.3, 0.3)) / n) * 2 * Math.PI;
				const rr = radius * between(0.75, 1.25);
				points.push([clampX(cx + rr * Math.cos(a)), clampY(cy + rr * Math.sin(a))]);
			}
			marks.push({ ...base, kind, points });
		} else if (kind === 'path') {
			const n = int(5, 30);
			const points: Point[] = [[clampX(cx), clampY(cy)]];
			let [x, y, heading] = [cx, cy, between(0, 2 * Math.PI)];
			for (let k = 1; k < n; k++) {
				heading += between(-0.6, 0.6);
				x += 30 * Math.cos(heading);
				y += 30 * Math.sin(heading);
				points.push([clampX(x), clampY(y)]);
			}
			marks.push({ ...base, kind, points });
		} else if (kind === 'pin') marks.push({ ...base, kind, at: [clampX(cx), clampY(cy)] });
		else marks.push({ ...base, kind, x: clampX(cx), y: clampY(cy), w: round(between(30, 180)), h: round(between(30, 180)) });
	}
	// Checked here first, so that a refusal by the server is the server's, not a bad layer's.
	return MarkLayerSchema.parse({ schemaVersion: MARK_SCHEMA_VERSION, marks, comments: [] });
}

const emptyLayer = (): MarkLayer => ({ schemaVersion: MARK_SCHEMA_VERSION, marks: [], comments: [] });

/** What the rAF loop in the page reports: frames painted, view changes sent, Konva draws if seen. */
interface FrameRun {
	frames: number;
	ms: number;
	events: number;
	draws: number | null;
	zoomText: string;
}

let stack: AppStack | undefined;
let context: BrowserContext | undefined;
try {
	const t0 = performance.now();
	ensureChromium(log);
	stack = await startAppStack('canvas', { worker: true, log });
	const { baseUrl, tmp } = stack;
	const profileDir = path.join(tmp, 'chromium');
	log(`PostgreSQL, build, app and worker ready in ${((performance.now() - t0) / 1000).toFixed(1)} s`);

	const cookie = await signIn(baseUrl);
	const call = async (url: string, init: { method?: string; json?: unknown } = {}) => {
		const body = init.json === undefined ? undefined : JSON.stringify(init.json);
		const res = await fetch(`${baseUrl}${url}`, {
			method: init.method ?? (body ? 'POST' : 'GET'),
			headers: { origin: baseUrl, cookie, ...(body ? { 'content-type': 'application/json' } : {}) },
			body,
		});
		const text = await res.text();
		if (!res.ok) throw new Error(`${init.method ?? 'GET'} ${url}: ${res.status} ${text.slice(0, 300)}`);
		return { status: res.status, text, json: JSON.parse(text) as unknown };
	};
	const me = (await call('/api/me')).json as { user: { id: string } };
	const specimenId = await createSpecimen(baseUrl, cookie, `BENCH.${process.pid}.CANVAS`);
	const check = (await call(`/api/specimens/${specimenId}/checks`, { json: {} })).json as { check: { id: string } };

	// The photo benchmark's invented 60 MP camera-like JPEG (seeded, so the same bytes every run).
	const t1 = performance.now();
	const [image] = await testImages(path.join(tmp, 'images'), ['60 MP']);
	log(`made a ${image!.width} × ${image!.height} JPEG (${(image!.bytes / 1e6).toFixed(1)} MB) in ${((performance.now() - t1) / 1000).toFixed(1)} s`);
	const t2 = performance.now();
	const uploadId = await tusUpload(image!.file, { endpoint: `${baseUrl}/api/uploads/`, origin: baseUrl, cookie, specimenId, checkId: check.check.id, chunkSize: 8 * 1024 * 1024 });
	let photoId: string | null = null;
	for (const until = Date.now() + 120_000; !photoId && Date.now() < until; ) {
		const { uploads } = (await call(`/api/uploads/status?id=${uploadId}`)).json as { uploads: { state: string; reason: string | null; photoId: string | null }[] };
		const u = uploads[0];
		if (u?.state === 'recorded') photoId = u.photoId;
		else if (u && ['refused', 'quarantined'].includes(u.state)) throw new Error(`upload ${u.state}: ${u.reason}`);
		else await new Promise((r) => setTimeout(r, 250));
	}
	if (!photoId) throw new Error('the upload was not recorded within 120 s (is the worker running?)');
	log(`uploaded and prepared by the worker in ${((performance.now() - t2) / 1000).toFixed(1)} s: photo ${photoId}`);

	const full = inventLayer(image!.width, image!.height, me.user.id);
	const layers = { empty: emptyLayer(), full };
	const marksUrl = `/api/photos/${photoId}/marks`;
	let version = ((await call(marksUrl)).json as { version: number }).version;
	/** PUT the layer at the current version and GET it back; the version is read from the PUT's answer. */
	const roundTrip = async (layer: MarkLayer) => {
		const body = JSON.stringify({ version, layer });
		const t = performance.now();
		const put = await call(marksUrl, { method: 'PUT', json: { version, layer } });
		const got = await call(marksUrl);
		const ms = performance.now() - t;
		version = (put.json as { version: number }).version;
		const back = got.json as { layer: MarkLayer; version: number };
		if (back.version !== version || back.layer.marks.length !== layer.marks.length) throw new Error(`the layer read back is not the one saved (version ${back.version}, ${back.layer.marks.length} marks)`);
		return { ms, putBytes: Buffer.byteLength(body), getBytes: Buffer.byteLength(got.text) };
	};

	// Save round trip: one warm-up each, then interleaved, so drift on the machine hits both alike.
	await roundTrip(layers.empty);
	await roundTrip(layers.full);
	const saves = { empty: [] as number[], full: [] as number[] };
	const bytes = { empty: { put: 0, get: 0 }, full: { put: 0, get: 0 } };
	for (let i = 0; i < SAVES; i++) {
		for (const which of ['empty', 'full'] as const) {
			const r = await roundTrip(layers[which]);
			saves[which].push(r.ms);
			bytes[which] = { put: r.putBytes, get: r.getBytes };
		}
	}
	log(`save round trip: empty ${median(saves.empty).toFixed(1)} ms, ${MARKS} marks ${median(saves.full).toFixed(1)} ms`);

	// Frame rate: the real page in headless Chromium, signed in through the form.
	context = await chromium.launchPersistentContext(profileDir, {
		executablePath: CHROMIUM,
		args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
		viewport: { width: 1400, height: 900 },
	});
	const page = context.pages()[0] ?? (await context.newPage());
	// tsx (esbuild, keepNames) wraps named functions in the code below in __name(), which the page lacks.
	await context.addInitScript('globalThis.__name = (f) => f;');
	await page.goto(`${baseUrl}/login`);
	await page.fill('#email', 'conservator@example.org');
	await page.fill('#password', demoPassword());
	await Promise.all([page.waitForURL((u) => !u.pathname.startsWith('/login')), page.click('button[type=submit]')]);

	/**
	 * One measured run: the page opened afresh, a second for the tiles, then for SECONDS a loop in
	 * the page that on every animation frame sends one view change (wheel zoom in for 12 frames,
	 * out for 12, about the canvas centre; and every third frame an arrow-key pan, which moves the
	 * photo when nothing is selected). A frame is a requestAnimationFrame callback: when a view
	 * change takes longer than a frame to render, fewer come.
	 */
	const measure = async (): Promise<FrameRun> => {
		await page.goto(`${baseUrl}/photos/${photoId}/marks`);
		await page.waitForSelector('[data-testid=mark-canvas] canvas', { timeout: 30_000 });
		await page.waitForTimeout(1000);
		return page.evaluate(async (seconds): Promise<FrameRun> => {
			const box = document.querySelector<HTMLElement>('[data-testid=mark-canvas]')!;
			box.focus();
			const r = box.getBoundingClientRect();
			const cx = r.left + r.width / 2;
			const cy = r.top + r.height / 2;
			// Konva's global, if this build exposes one: its stages' layers count their draws.
			const konva = (window as unknown as { Konva?: { stages?: { getLayers(): { on(e: string, f: () => void): void }[] }[] } }).Konva;
			let draws: number | null = null;
			if (konva?.stages?.length) {
				draws = 0;
				for (const s of konva.stages) for (const l of s.getLayers()) l.on('draw', () => void (draws = (draws ?? 0) + 1));
			}
			let frames = 0;
			let events = 0;
			const keys = ['ArrowLeft', 'ArrowUp', 'ArrowRight', 'ArrowDown'];
			return new Promise<FrameRun>((resolve) => {
				const start = performance.now();
				const tick = (now: number) => {
					if (now - start >= seconds * 1000) {
						const footer = box.parentElement?.querySelector('p.text-xs')?.textContent ?? '';
						resolve({ frames, ms: now - start, events, draws, zoomText: /(\d+) %/.exec(footer)?.[1] ?? '?' });
						return;
					}
					frames++;
					const zoomIn = Math.floor(frames / 12) % 2 === 0;
					box.dispatchEvent(new WheelEvent('wheel', { deltaY: zoomIn ? -60 : 60, clientX: cx, clientY: cy, bubbles: true, cancelable: true }));
					events++;
					if (frames % 3 === 0) {
						box.dispatchEvent(new KeyboardEvent('keydown', { key: keys[Math.floor(frames / 3) % 4]!, bubbles: true, cancelable: true }));
						events++;
					}
					requestAnimationFrame(tick);
				};
				requestAnimationFrame(tick);
			});
		}, SECONDS);
	};

	// Interleaved, the layer swapped before each run: no marks, then 1,000 marks, RUNS times.
	const fps = { empty: [] as number[], full: [] as number[] };
	const drawsPerSecond = { empty: [] as number[], full: [] as number[] };
	for (let i = 0; i < RUNS; i++) {
		for (const which of ['empty', 'full'] as const) {
			await roundTrip(layers[which]);
			const run = await measure();
			const f = (run.frames / run.ms) * 1000;
			fps[which].push(f);
			if (run.draws !== null) drawsPerSecond[which].push((run.draws / run.ms) * 1000);
			log(`${which === 'empty' ? 'no marks' : `${MARKS} marks`} #${i + 1}: ${f.toFixed(1)} fps (${run.frames} frames, ${run.events} view changes${run.draws !== null ? `, ${run.draws} Konva layer draws` : ''}, zoom ends at ${run.zoomText} %)`);
		}
	}

	const fpsEmpty = median(fps.empty);
	const fpsFull = median(fps.full);
	const fpsRatio = fpsFull / fpsEmpty;
	emitHeadline({ label: 'mark canvas: frame rate with 1,000 marks ÷ none', ratio: fpsRatio, target: { value: 0.8, better: 'higher' } });
	const saveEmpty = median(saves.empty);
	const saveFull = median(saves.full);
	const kinds = full.marks.reduce<Record<string, number>>((acc, m) => ((acc[m.kind] = (acc[m.kind] ?? 0) + 1), acc), {});
	const vertices = full.marks.reduce((n, m) => n + ('points' in m ? m.points.length : m.kind === 'box' ? 4 : 1), 0);
	const drawRows = drawsPerSecond.empty.length && drawsPerSecond.full.length ? [['Konva layer draws per second (median)', median(drawsPerSecond.empty).toFixed(1), median(drawsPerSecond.full).toFixed(1), ratio(median(drawsPerSecond.full), median(drawsPerSecond.empty)), '']] : [];
	emitPart(
		[
			'## Mark-up canvas: 1,000 marks against none',
			'',
			`One invented ${image!.width} × ${image!.height} (60 MP) JPEG of ${(image!.bytes / 1e6).toFixed(1)} MB, uploaded by tus to a condition check of a new specimen and prepared by the real photo worker (\`scripts/worker.ts\`), on the production build with a throwaway PostgreSQL, signed in as the demo conservator. The 1,000-mark layer is invented and seeded: ${Object.entries(kinds).map(([k, n]) => `${n} ${k === 'box' ? 'boxes' : `${k}s`}`).join(', ')} (${vertices.toLocaleString('en-GB')} vertices in all), parts and terms from the default vocabulary, severities 1–3, checked with \`MarkLayerSchema\` before it is sent. Baselines (an empty layer) measured in the same run, interleaved.`,
			'',
			`**Save round trip**: PUT \`/api/photos/<id>/marks\` with \`{ version, layer }\` (the version read from the previous answer) then GET of the same, timed together from this process; medians of ${SAVES} after one warm-up each. Bytes are JSON bodies.`,
			'',
			table(
				['layer', 'PUT + GET (ms, median)', 'runs (ms)', '× empty', 'PUT body (bytes)', 'GET body (bytes)', '× empty (PUT bytes)'],
				[
					['empty (**baseline**)', saveEmpty.toFixed(1), saves.empty.map((v) => v.toFixed(1)).join(', '), '1.00×', String(bytes.empty.put), String(bytes.empty.get), '1.00×'],
					[`${MARKS.toLocaleString('en-GB')} marks`, saveFull.toFixed(1), saves.full.map((v) => v.toFixed(1)).join(', '), ratio(saveFull, saveEmpty), String(bytes.full.put), String(bytes.full.get), ratio(bytes.full.put, bytes.empty.put)],
				],
			),
			'',
			`**Pan and zoom frame rate**: \`/photos/<id>/marks\` in headless Chromium (playwright-core, 1400 × 900 viewport), opened afresh for each run and given a second for its tiles; then for ${SECONDS} s a loop in the page sends on every animation frame one wheel zoom over the canvas centre (12 frames in, 12 out, in turn) and on every third frame an arrow-key pan. Frames are requestAnimationFrame callbacks per second: a view change that takes longer than a frame to render lowers it. Medians of ${RUNS} runs each, interleaved, the layer swapped by PUT before each. Target: 1,000 marks at or above 0.8× the frame rate with none.`,
			'',
			table(
				['', 'no marks (**baseline**)', `${MARKS.toLocaleString('en-GB')} marks`, '× baseline', 'target ≥ 0.8×'],
				[
					['frames per second (median)', fpsEmpty.toFixed(1), fpsFull.toFixed(1), ratio(fpsFull, fpsEmpty), `${fpsRatio >= 0.8 ? 'met' : '**missed**'} (${fpsRatio.toFixed(3)}×)`],
					['runs (fps)', fps.empty.map((v) => v.toFixed(1)).join(', '), fps.full.map((v) => v.toFixed(1)).join(', '), '', ''],
					...drawRows,
				],
			),
			'',
			'Headless Chromium with `--disable-gpu` rasterises the canvas on the CPU, so the absolute frame rates are lower than on a desktop with a GPU (and depend on what else the machine is doing); the ratio between the two layers, measured the same way in the same run, is the figure to read. requestAnimationFrame runs at most 60 times a second here, so a ratio near 1 means both layers keep that pace. While the view moves the marks are shown from a bitmap drawn by a worker (stretched up to 4× before a new one is asked for, see `src/lib/marks/snapshot.ts`); 150 ms after it stops they are stroked again from the data, so a still picture looks exactly as before. This loop never stops, so it does not time that one sharp redraw.',
		].join('\n'),
	);
} finally {
	await context?.close().catch(() => {});
	await stack?.stop();
}
