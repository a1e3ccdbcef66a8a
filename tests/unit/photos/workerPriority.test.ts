import fs from 'node:fs';
import path from 'node:path';
import { execFileSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';

/**
 * The photo worker's lower priority (TESTPLAN L2: other routes keep their pace) must reach every
 * thread: on Linux a nice value is per thread and a new thread takes its creator's (setpriority(2)).
 * Run in a child node so this test process keeps its own priority.
 */
const root = path.resolve(import.meta.dirname, '..', '..', '..');
const script = `
import crypto from 'node:crypto';
import fs from 'node:fs';
import { Worker } from 'node:worker_threads';
import { lowerPriority } from ${JSON.stringify(path.join(root, 'src/lib/server/photos/priority.ts'))};
// Threads that exist before: libuv's pool, started by work queued on it.
await Promise.all([1, 2, 3, 4].map(() => new Promise((r) => crypto.pbkdf2('p', 's', 1000, 32, 'sha256', r))));
const set = lowerPriority(7);
// A thread started after, as libvips starts its own.
const w = new Worker('setTimeout(() => {}, 300)', { eval: true });
await new Promise((r) => setTimeout(r, 100));
const nice = fs.readdirSync('/proc/self/task').map((t) => Number(fs.readFileSync('/proc/self/task/' + t + '/stat', 'utf8').split(') ')[1].split(' ')[16]));
await w.terminate();
console.log(JSON.stringify({ set, nice }));
`;

describe('lowerPriority', () => {
	it.runIf(fs.existsSync('/proc/self/task'))('sets every thread, those there before and those started after', () => {
		const out = execFileSync(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', script], { cwd: root, encoding: 'utf8' });
		const { set, nice } = JSON.parse(out.trim().split('\n').pop()!) as { set: number; nice: number[] };
		expect(set).toBeGreaterThan(4);
		expect(nice.length).toBeGreaterThan(set);
		expect(nice.every((n) => n === 7)).toBe(true);
	});
});
