import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { spawnSync } from 'node:child_process';

/**
 * The outside programs the photo benchmark compares against and measures with: ImageMagick (the
 * baseline) and GNU time (peak memory of a child, measured the same way for every contender).
 * Nothing is downloaded except Debian packages through apt, and only when running as root.
 */

const isRoot = () => process.getuid?.() === 0;

function aptInstall(pkg: string, log: (m: string) => void): boolean {
	if (!isRoot()) return false;
	log(`installing Debian's ${pkg} package (apt-get install -y ${pkg})…`);
	const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
	const install = () => spawnSync('apt-get', ['install', '-y', pkg], { env, encoding: 'utf8' });
	let r = install();
	if (r.status !== 0) {
		// A fresh machine may have no package lists yet.
		spawnSync('apt-get', ['update'], { env, encoding: 'utf8' });
		r = install();
	}
	if (r.status !== 0) log(`apt-get install ${pkg} failed: ${(r.stderr || r.stdout || '').trim().split('\n').slice(-3).join(' / ')}`);
	return r.status === 0;
}

export type ImageMagick = { ok: true; convert: string; version: string } | { ok: false; why: string };

/** The real ImageMagick's `convert` and its version, or null. */
export function findImageMagick(): { convert: string; version: string } | null {
	// Debian's own binary first: a `convert` earlier on PATH may be a wrapper or a stand-in, and a
	// wrapper's start-up would be timed as ImageMagick's.
	for (const c of ['/usr/bin/convert', 'convert']) {
		const r = spawnSync(c, ['-version'], { encoding: 'utf8' });
		const first = r.status === 0 ? (r.stdout.split('\n')[0] ?? '') : '';
		if (first.startsWith('Version: ImageMagick')) return { convert: c, version: first.replace(/^Version: /, '') };
	}
	return null;
}

export function ensureImageMagick(log: (m: string) => void): ImageMagick {
	const found = findImageMagick();
	if (found) return { ok: true, ...found };
	if (!isRoot()) return { ok: false, why: 'ImageMagick is not installed and this is not root, so it cannot be installed here: skipped the ImageMagick comparison (install it with `apt-get install -y imagemagick`).' };
	if (!aptInstall('imagemagick', log)) return { ok: false, why: 'ImageMagick is not installed and `apt-get install -y imagemagick` failed: skipped the ImageMagick comparison.' };
	const after = findImageMagick();
	return after ? { ok: true, ...after } : { ok: false, why: 'apt-get installed imagemagick but no working `convert` was found: skipped the ImageMagick comparison.' };
}

/** GNU time's path (for the peak memory of a child), installing Debian's `time` package if root. */
export function ensureGnuTime(log: (m: string) => void): string | null {
	const ok = () => spawnSync('/usr/bin/time', ['-v', 'true'], { encoding: 'utf8' }).status === 0;
	if (ok()) return '/usr/bin/time';
	if (aptInstall('time', log) && ok()) return '/usr/bin/time';
	log('GNU time (/usr/bin/time) is missing and cannot be installed: peak memory is not measured.');
	return null;
}

export interface Measured {
	/** Wall time of the whole child process, start to exit, as seen by this process. */
	wallMs: number;
	/** Peak resident set size of the child (GNU time's "Maximum resident set size"), or null. */
	maxRssKb: number | null;
	status: number | null;
	stdout: string;
	stderr: string;
}

/** Runs one child under GNU time (when there is one) and reports its wall time and peak memory. */
export function measure(gnuTime: string | null, cmd: string, args: readonly string[], opts: { env?: NodeJS.ProcessEnv; cwd?: string } = {}): Measured {
	const out = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'meniscus-time-')), 'time.txt');
	const [file, argv] = gnuTime ? [gnuTime, ['-v', '-o', out, cmd, ...args]] : [cmd, [...args]];
	const t = performance.now();
	const r = spawnSync(file, argv, { env: opts.env ?? process.env, cwd: opts.cwd, encoding: 'utf8', maxBuffer: 256 * 1024 * 1024 });
	const wallMs = performance.now() - t;
	let maxRssKb: number | null = null;
	if (gnuTime && fs.existsSync(out)) {
		const m = /Maximum resident set size \(kbytes\): (\d+)/.exec(fs.readFileSync(out, 'utf8'));
		maxRssKb = m ? Number(m[1]) : null;
	}
	fs.rmSync(path.dirname(out), { recursive: true, force: true });
	return { wallMs, maxRssKb, status: r.status, stdout: r.stdout ?? '', stderr: r.stderr ?? '' };
}
