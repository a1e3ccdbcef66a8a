import fs from 'node:fs';

/**
 * Memory and CPU of a process and everything it started, read from Linux's /proc (proc(5)):
 * /proc/<pid>/status VmRSS is the resident set now, VmHWM its peak since the process began;
 * /proc/<pid>/stat utime and stime its CPU time. A service started through a wrapper (tsx runs
 * the script in a child node) is measured as the whole tree.
 */
export interface TreeMemory {
	pids: number[];
	/** Sum of VmRSS over the tree, in bytes. */
	rss: number;
	/** Sum of VmHWM over the tree, in bytes: an upper bound of the tree's peak (each may peak apart). */
	hwm: number;
	/** The largest single process: its VmRSS and VmHWM, in bytes. */
	largest: { pid: number; rss: number; hwm: number };
}

function status(pid: number): Map<string, string> | null {
	try {
		const text = fs.readFileSync(`/proc/${pid}/status`, 'utf8');
		return new Map(text.split('\n').map((l) => [l.slice(0, l.indexOf(':')), l.slice(l.indexOf(':') + 1).trim()] as [string, string]));
	} catch {
		return null; // gone
	}
}

const kib = (v: string | undefined) => Number((v ?? '0 kB').split(/\s+/)[0]) * 1024;

/** The pid and every descendant, found by each process's PPid. */
export function processTree(root: number): number[] {
	const parents = new Map<number, number[]>();
	for (const name of fs.readdirSync('/proc')) {
		if (!/^\d+$/.test(name)) continue;
		const ppid = Number(status(Number(name))?.get('PPid'));
		if (Number.isFinite(ppid)) parents.set(ppid, [...(parents.get(ppid) ?? []), Number(name)]);
	}
	const out: number[] = [];
	const visit = (pid: number) => {
		out.push(pid);
		for (const child of parents.get(pid) ?? []) visit(child);
	};
	visit(root);
	return out;
}

export function treeMemory(pids: readonly number[]): TreeMemory {
	const m: TreeMemory = { pids: [...pids], rss: 0, hwm: 0, largest: { pid: 0, rss: 0, hwm: 0 } };
	for (const pid of pids) {
		const s = status(pid);
		if (!s) continue;
		const rss = kib(s.get('VmRSS'));
		const hwm = kib(s.get('VmHWM'));
		m.rss += rss;
		m.hwm += hwm;
		if (hwm > m.largest.hwm) m.largest = { pid, rss, hwm };
	}
	return m;
}

export const mib = (bytes: number) => `${(bytes / 1024 ** 2).toFixed(0)} MiB`;

/** CPU seconds (user + system) used so far by the processes, all their threads included. */
export function cpuSeconds(pids: readonly number[]): number {
	let ticks = 0;
	for (const pid of pids) {
		try {
			// Fields after the command name (which may hold spaces) in ")": utime is the 14th, stime the 15th.
			const rest = fs.readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
			ticks += Number(rest[11]) + Number(rest[12]);
		} catch {
			// gone
		}
	}
	// USER_HZ is 100 on Linux (sysconf(_SC_CLK_TCK); proc(5)).
	return ticks / 100;
}

/** The nice value of every thread of a process (/proc/<pid>/task/<tid>/stat, field 19). */
export function threadNice(pid: number): number[] {
	return fs.readdirSync(`/proc/${pid}/task`).map((tid) => Number(fs.readFileSync(`/proc/${pid}/task/${tid}/stat`, 'utf8').split(') ')[1]!.split(' ')[16]));
}
