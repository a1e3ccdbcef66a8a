import fs from 'node:fs';
import os from 'node:os';

/**
 * Lowers the CPU priority of this whole process (Linux nice, setpriority(2)), so that decoding and
 * tiling photos yields to the web server when both want the same cores: the app's answers keep
 * their pace while a flood of uploads is processed, and the worker still has every idle cycle.
 * On Linux a nice value belongs to each thread (setpriority(2), "BUGS"), and a new thread takes
 * its creator's: every thread there is now (libuv's pool, V8's) is set, and libvips's threads,
 * started later from these, inherit it. Returns the threads set.
 */
export function lowerPriority(nice: number): number {
	let tids: string[];
	try {
		tids = fs.readdirSync('/proc/self/task');
	} catch {
		// No /proc (not Linux): the process-wide call is all there is.
		os.setPriority(nice);
		return 1;
	}
	for (const tid of tids) os.setPriority(Number(tid), nice);
	return tids.length;
}
