// One measurement for bench/photoIngest.ts, in a process of its own so that its peak memory can be
// read the way ImageMagick's is (GNU time's maximum resident set size): what the photo worker does
// per photo, minus the database. Prints one JSON line with the time of each stage.
//   node --import tsx bench/photoIngestRun.ts ingest <master.jpg> <threads> <setDir>
//   node --import tsx bench/photoIngestRun.ts noop   (loads the same modules, does nothing: the floor)
import fs from 'node:fs';
import path from 'node:path';
import { configureSharp, inspect, makeDerivatives, readExif } from '../src/lib/server/photos/pipeline.ts';
import { sha256File } from '../src/lib/server/photos/storage.ts';

export interface RunResult {
	threads: number;
	stages: { hash: number; inspect: number; exif: number; derivatives: number };
	total: number;
	outputs: { kind: string; width: number; height: number; byteSize: number }[];
	tiles: number;
	scaleFactors: number[];
}

const [mode, master, threadsArg, setDir] = process.argv.slice(2);
if (mode === 'noop') {
	console.log(JSON.stringify({ noop: true }));
	process.exit(0);
}
if (mode !== 'ingest' || !master || !threadsArg || !setDir) {
	console.error('usage: photoIngestRun.ts ingest <master> <threads> <setDir> | noop');
	process.exit(2);
}
const threads = Number(threadsArg);
// The order of the worker (src/lib/server/photos/ingest.ts): inspect, hash, EXIF, derivatives.
configureSharp(threads);
const t0 = performance.now();
const found = await inspect(master);
const t1 = performance.now();
if (!found.ok) throw new Error(`refused: ${found.refusal.code}: ${found.refusal.reason}`);
await sha256File(master);
const t2 = performance.now();
await readExif(master);
const t3 = performance.now();
const set = await makeDerivatives(master, setDir);
const t4 = performance.now();

const tiles = fs.readdirSync(path.join(setDir, 'tiles'), { recursive: true }).map(String).filter((p) => p.endsWith('.jpg')).length;
const info = JSON.parse(fs.readFileSync(path.join(setDir, 'tiles', 'info.json'), 'utf8')) as { tiles: { scaleFactors: number[] }[] };
const result: RunResult = {
	threads,
	stages: { inspect: t1 - t0, hash: t2 - t1, exif: t3 - t2, derivatives: t4 - t3 },
	total: t4 - t0,
	outputs: set.map(({ kind, width, height, byteSize }) => ({ kind, width, height, byteSize })),
	tiles,
	scaleFactors: info.tiles[0]?.scaleFactors ?? [],
};
console.log(JSON.stringify(result));
