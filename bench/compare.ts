// Change detection between two mark layers (src/lib/compare/changes.ts) at 250, 500 and 1,000 damage
// marks a side: invented, seeded layers (tests/unit/compare/synthetic.ts, the layers the unit tests
// check) whose after photograph is seen through a perspective transform and registered by its
// control marks. Pure computation in this process, no app stack. What matters is how the time grows:
// doubling n should cost about 2–2.3× (n log n), well under the 4× of comparing every pair. Run:
// `npm run bench -- compare`. Settings: BENCH_COMPARE_REPEATS (15).
import os from 'node:os';
import { compareMarkLayers } from '../src/lib/compare/changes.ts';
import { pairsFromControlMarks } from '../src/lib/compare/pairs.ts';
import { fitHomography, type Matrix3 } from '../src/lib/compare/registration.ts';
import { isDamage, type MarkLayer } from '../src/lib/marks/schema.ts';
import { syntheticPair } from '../tests/unit/compare/synthetic.ts';
import { emitPart, median, ms, ratio, table, emitHeadline } from './lib/report.ts';

const REPEATS = Math.max(3, Number(process.env.BENCH_COMPARE_REPEATS ?? 15));
const SIZES = [250, 500, 1000] as const;
const CAPACITY = 1100;
const log = (m: string) => console.log(`[compare] ${m}`);

// The after camera a little to one side and above: before-photo px → after-photo px.
const VIEW: Matrix3 = [
	[0.95, 0.04, 160],
	[-0.02, 0.93, 110],
	[-1.1e-5, 1.6e-5, 1],
];

interface Case {
	n: number;
	before: MarkLayer;
	after: MarkLayer;
	transform: Matrix3;
	counts: string;
	/** Wall-clock ms of each run. */
	runs: number[];
	/** CPU ms of this process in each run (user + system): less swayed by other work on the machine. */
	cpu: number[];
}

const cases: Case[] = SIZES.map((n) => {
	// One grid for every n (laid out for the largest), so marks are alike in size and only their number grows.
	const { before, after, expected } = syntheticPair(n, { perspective: VIEW, capacity: CAPACITY });
	const transform = fitHomography(pairsFromControlMarks(after, before));
	// A warm-up (JIT), which is also the check that the figures are for a comparison that got it right.
	const first = compareMarkLayers(before, after, { transform });
	const wrong = first.changes.filter((c) => expected.get((c.before ?? c.after)!.id) !== c.change).length;
	if (wrong > 0) throw new Error(`${wrong} of ${first.changes.length} marks classed other than built at n = ${n}`);
	const counts = Object.entries(first.summary.counts).map(([k, v]) => `${v} ${k}`).join(', ');
	return { n, before, after, transform, counts, runs: [], cpu: [] };
});
// Interleaved, so that other work on the machine falls on every size alike.
for (let i = 0; i < REPEATS; i++) {
	for (const c of cases) {
		const cpu = process.cpuUsage();
		const t = performance.now();
		compareMarkLayers(c.before, c.after, { transform: c.transform });
		c.runs.push(performance.now() - t);
		const used = process.cpuUsage(cpu);
		c.cpu.push((used.user + used.system) / 1000);
	}
}
for (const c of cases) log(`${c.n} marks a side: median ${ms(median(c.runs))} ms wall, ${ms(median(c.cpu))} ms CPU over ${REPEATS} (${c.counts})`);
const damageCount = (layer: MarkLayer) => layer.marks.filter(isDamage).length;

const at = (n: number, which: 'runs' | 'cpu' = 'runs') => median(cases.find((c) => c.n === n)![which]);
const load = os.loadavg().map((l) => l.toFixed(2)).join(', ');
emitHeadline({ label: 'mark comparison: time at 1,000 marks ÷ 250 (n² would be 16×)', ratio: at(1000) / at(250) });
emitPart(
	[
		'## Mark layer comparison: 250, 500 and 1,000 marks a side',
		'',
		`\`compareMarkLayers\` on invented, seeded layers (\`tests/unit/compare/synthetic.ts\`): outlines, lines, boxes and pins, one to a cell of a jittered grid laid out for 1,100 marks over a 9504 × 6336 photograph (so marks are alike in size at every n, the smaller layers filling its first rows), parts and terms from the default vocabulary; in the after layer one mark in ten is gone, one in ten is new, about three in ten grew or shrank and the rest moved under a pixel, all seen through a perspective transform (boxes becoming outlines) and registered back by six control-point pairs (\`fitHomography\`, outside the timing). Every run's classes were checked against how the layers were built before timing. Medians of ${REPEATS} runs after one warm-up, the sizes interleaved, in this one process. The baseline for each row is the row with half the marks: n log n work grows about 2–2.3× per doubling, comparing every pair 4×.`,
		'',
		table(
			['marks a side (before)', 'damage marks after', 'compare, wall (ms, median)', '× half the marks', 'compare, CPU (ms, median)', '× half the marks', 'runs, wall (ms)', 'classes found'],
			cases.map((c, i) => [
				c.n.toLocaleString('en-GB'),
				damageCount(c.after).toLocaleString('en-GB'),
				ms(median(c.runs)),
				i === 0 ? '(baseline)' : ratio(median(c.runs), median(cases[i - 1]!.runs)),
				ms(median(c.cpu)),
				i === 0 ? '(baseline)' : ratio(median(c.cpu), median(cases[i - 1]!.cpu)),
				c.runs.map(ms).join(', '),
				c.counts,
			]),
		),
		'',
		`Wall clock: t(500)/t(250) = ${ratio(at(500), at(250))}, t(1,000)/t(500) = ${ratio(at(1000), at(500))}, t(1,000)/t(250) = ${ratio(at(1000), at(250))}; CPU time: ${ratio(at(500, 'cpu'), at(250, 'cpu'))}, ${ratio(at(1000, 'cpu'), at(500, 'cpu'))}, ${ratio(at(1000, 'cpu'), at(250, 'cpu'))} (n² would give 4×, 4× and 16×). Load average when the figures were written: ${load}; the wall-clock figures swing with other work on the machine, the CPU time (this process's user + system time, which includes V8's own garbage-collection threads) less so.`,
	].join('\n'),
);
