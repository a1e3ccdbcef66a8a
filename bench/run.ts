// `npm run bench`: every benchmark, each in a process of its own (so that one's memory and threads
// do not colour the next), then their figures joined into bench/REPORT.md with the machine they
// ran on. `npm run bench -- photos upload` runs only those (register, photos, upload); the report
// then holds only what ran, since figures from different runs must not sit side by side.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { spawnSync } from 'node:child_process';
import { machine, machineMarkdown } from './lib/machine.ts';
import { table, type Headline } from './lib/report.ts';
import { headlineChart } from './lib/chart.ts';

const root = path.resolve(import.meta.dirname, '..');
const BENCHMARKS = {
	register: { file: 'register.ts', what: 'register queries at 10,000 specimens' },
	photos: { file: 'photoIngest.ts', what: 'photo ingest (24 MP, 60 MP) against ImageMagick' },
	upload: { file: 'uploadThroughput.ts', what: 'tus upload throughput against a plain PUT' },
	canvas: { file: 'canvas.ts', what: 'mark canvas: save round trip and pan/zoom frame rate, 1,000 marks against none' },
	compare: { file: 'compare.ts', what: 'mark layer comparison: change detection at 250, 500 and 1,000 marks a side' },
} as const;
type Name = keyof typeof BENCHMARKS;
const isName = (s: string): s is Name => s in BENCHMARKS;

const asked = process.argv.slice(2);
const unknown = asked.filter((a) => !isName(a));
if (unknown.length) {
	console.error(`Unknown benchmark ${unknown.join(', ')}; choose from: ${Object.keys(BENCHMARKS).join(', ')}.`);
	process.exit(2);
}
const selected: Name[] = asked.length ? asked.filter(isName) : (Object.keys(BENCHMARKS) as Name[]);

const partsDir = fs.mkdtempSync(path.join(os.tmpdir(), 'meniscus-bench-report-'));
const started = new Date();
// Other work on the machine shows in every figure; the ratios to same-run baselines absorb most of it.
const load = os.loadavg().map((l) => l.toFixed(2)).join(', ');
const done: { name: Name; seconds: number; status: number | null; part: string }[] = [];
const headlines: Headline[] = [];
try {
	for (const name of selected) {
		console.log(`\n=== ${name}: ${BENCHMARKS[name].what}`);
		const part = path.join(partsDir, `${name}.md`);
		const t = performance.now();
		const r = spawnSync(process.execPath, ['--import', 'tsx', path.join(root, 'bench', BENCHMARKS[name].file)], {
			cwd: root,
			stdio: 'inherit',
			env: { ...process.env, BENCH_REPORT_PART: part, ASTRO_TELEMETRY_DISABLED: '1' },
		});
		const seconds = (performance.now() - t) / 1000;
		const text = fs.existsSync(part) ? fs.readFileSync(part, 'utf8').trim() : '';
		const lines = `${part}.headlines.jsonl`;
		if (fs.existsSync(lines)) headlines.push(...fs.readFileSync(lines, 'utf8').trim().split('\n').filter(Boolean).map((l) => JSON.parse(l) as Headline));
		done.push({ name, seconds, status: r.status, part: text || `## ${name}\n\nFailed (exit status ${r.status}) before reporting; see the console output.` });
		console.log(`=== ${name}: ${r.status === 0 ? 'done' : `FAILED (exit status ${r.status})`} in ${seconds.toFixed(0)} s`);
	}
} finally {
	fs.rmSync(partsDir, { recursive: true, force: true });
}

const git = (args: string[]) => spawnSync('git', args, { cwd: root, encoding: 'utf8' }).stdout.trim();
const commit = git(['rev-parse', '--short', 'HEAD']);
const dirty = git(['status', '--porcelain', '--untracked-files=no']) ? ' with uncommitted changes' : '';
const report = [
	'# Meniscus benchmarks',
	'',
	`Written by \`npm run bench${asked.length ? ` -- ${asked.join(' ')}` : ''}\` on ${started.toISOString().slice(0, 16).replace('T', ' ')} UTC at commit ${commit}${dirty}. Every figure is a median over repeats, shown with its ratio to a baseline measured in the same run; each benchmark says which. Performance targets live here, never in timed unit tests.`,
	'',
	machineMarkdown(machine(), [['Load average at start (1, 5, 15 min)', load]]),
	'',
	...(headlines.length ? ['![Each headline figure against its same-run baseline, log scale, with the targets](REPORT.svg)', '', `The chart repeats ${headlines.length} headline figures from the sections below: each is a ratio to a baseline measured in the same run (bars left of 1× are below the baseline), with the issue's target dashed where there is one.`, ''] : []),
	table(
		['benchmark', 'status', 'took (s)'],
		done.map((d) => [d.name, d.status === 0 ? 'ok' : `**failed** (${d.status})`, d.seconds.toFixed(0)]),
	),
	'',
	...done.map((d) => `${d.part}\n`),
].join('\n');
fs.writeFileSync(path.join(root, 'bench', 'REPORT.md'), report);
if (headlines.length) fs.writeFileSync(path.join(root, 'bench', 'REPORT.svg'), headlineChart(headlines));
else fs.rmSync(path.join(root, 'bench', 'REPORT.svg'), { force: true });
console.log(`\nWrote bench/REPORT.md (${done.map((d) => `${d.name} ${d.seconds.toFixed(0)} s`).join(', ')}).`);
process.exit(done.every((d) => d.status === 0) ? 0 : 1);
