import fs from 'node:fs';
import path from 'node:path';

/**
 * The nearest thing to pulling the plug on PostgreSQL that a test can do (TESTPLAN F5): SIGKILL to
 * the postmaster of one cluster and to every process it started, all at once, so nothing gets to
 * flush, checkpoint or say goodbye; the next start must recover from the WAL. Only the cluster
 * whose data folder is named is touched: its postmaster is read from postmaster.pid and checked to
 * be a postgres for that folder, and its children are those whose parent it is.
 */
const cmdline = (pid: number) => {
	try {
		return fs.readFileSync(`/proc/${pid}/cmdline`, 'utf8').split('\0');
	} catch {
		return [];
	}
};

const parentOf = (pid: string) => {
	try {
		// /proc/<pid>/stat: "pid (comm) state ppid …"; comm may hold spaces, so read after the last ')'.
		const stat = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
		return Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1]);
	} catch {
		return -1;
	}
};

/**
 * Still in the process table, zombies included: a new postmaster takes a lock file naming a pid
 * that kill(pid, 0) still finds (a zombie not yet reaped) for a live one, and refuses to start.
 */
const present = (pid: number) => fs.existsSync(`/proc/${pid}`);

export async function killCluster(dataDir: string): Promise<{ postmaster: number; children: number }> {
	const postmaster = Number(fs.readFileSync(path.join(dataDir, 'postmaster.pid'), 'utf8').split('\n')[0]);
	const argv = cmdline(postmaster);
	const d = argv.indexOf('-D');
	if (!/postgres$/.test(path.basename(argv[0] ?? '')) || d < 0 || path.resolve(argv[d + 1] ?? '') !== path.resolve(dataDir)) {
		throw new Error(`pid ${postmaster} is not the postmaster of ${dataDir} (${argv.join(' ')})`);
	}
	const children = fs.readdirSync('/proc').filter((p) => /^\d+$/.test(p) && parentOf(p) === postmaster).map(Number);
	for (const pid of [postmaster, ...children]) {
		try {
			process.kill(pid, 'SIGKILL');
		} catch {
			// Gone already.
		}
	}
	const until = Date.now() + 30_000;
	while ([postmaster, ...children].some(present)) {
		if (Date.now() > until) throw new Error(`postgres processes of ${dataDir} still in the process table 30 s after SIGKILL`);
		await new Promise((r) => setTimeout(r, 100));
	}
	return { postmaster, children: children.length };
}
