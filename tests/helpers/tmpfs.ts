import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

/**
 * A small tmpfs for the disk-full tests (TESTPLAN F7): mounted by the test (it runs as root), filled
 * to within a few bytes of its size, emptied, unmounted. A mount that is not permitted fails the
 * test with the reason: a disk-full test that quietly ran on the real disk would prove nothing.
 */
export function mountTmpfs(dir: string, sizeMiB: number): void {
	fs.mkdirSync(dir, { recursive: true });
	const r = spawnSync('mount', ['-t', 'tmpfs', '-o', `size=${sizeMiB}m,mode=0755`, 'tmpfs', dir], { encoding: 'utf8' });
	if (r.status !== 0) {
		throw new Error(`TESTPLAN F7 needs a small tmpfs and could not mount one at ${dir} (mount exit ${r.status}: ${(r.stderr || r.error?.message || '').trim()}). Run the reliability suite as root (or with CAP_SYS_ADMIN).`);
	}
}

/** Unmounts if mounted (lazily if something still holds a file open), then removes the mount point. */
export function unmountTmpfs(dir: string): void {
	if (isMountPoint(dir)) {
		const r = spawnSync('umount', [dir], { encoding: 'utf8' });
		if (r.status !== 0) spawnSync('umount', ['-l', dir]);
	}
	if (!isMountPoint(dir)) fs.rmSync(dir, { recursive: true, force: true });
}

export function isMountPoint(dir: string): boolean {
	const target = path.resolve(dir);
	return fs.readFileSync('/proc/self/mounts', 'utf8').split('\n').some((l) => l.split(' ')[1] === target);
}

/** Bytes an unprivileged write could still use (tmpfs reserves nothing for root, so this is all of it). */
export function freeBytes(dir: string): number {
	const s = fs.statfsSync(dir);
	return s.bavail * s.bsize;
}

const FILLER = '.f7-filler';

/** Takes up all but about `leave` bytes of the filesystem with a file of zeros (tmpfs stores every page). */
export function fill(dir: string, leave: number): void {
	const fd = fs.openSync(path.join(dir, FILLER), 'a');
	try {
		const chunk = Buffer.alloc(1024 * 1024);
		for (let room = freeBytes(dir) - leave; room > 0; room = freeBytes(dir) - leave) fs.writeSync(fd, chunk, 0, Math.min(chunk.length, room));
	} finally {
		fs.closeSync(fd);
	}
}

/** Gives the space back. */
export function unfill(dir: string): void {
	fs.rmSync(path.join(dir, FILLER), { force: true });
}
