// npm dependencies, installed with `npm ci` when node_modules is missing or older than the lock
// file. Builtins only: this runs before anything is installed.
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

export function ensureDeps(root, log = console.log) {
	const lock = path.join(root, 'package-lock.json');
	const stamp = path.join(root, 'node_modules', '.meniscus-lock-sha256');
	const want = createHash('sha256').update(fs.readFileSync(lock)).digest('hex');
	const have = fs.existsSync(stamp) ? fs.readFileSync(stamp, 'utf8').trim() : null;
	if (have === want) return false;
	// Installed by a plain `npm ci` (as CI does): npm's hidden lock file is newer than ours.
	const hidden = path.join(root, 'node_modules', '.package-lock.json');
	if (!have && fs.existsSync(hidden) && fs.statSync(hidden).mtimeMs >= fs.statSync(lock).mtimeMs) {
		fs.writeFileSync(stamp, want);
		return false;
	}
	log(have ? 'Dependencies changed: running npm ci…' : 'Installing dependencies with npm ci (about a minute the first time)…');
	const r = spawnSync('npm', ['ci', '--no-audit', '--no-fund'], { cwd: root, stdio: 'inherit' });
	if (r.status !== 0) throw new Error('npm ci failed; see the messages above.');
	fs.writeFileSync(stamp, want);
	return true;
}
