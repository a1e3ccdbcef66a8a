// Debian's Chromium for the browser tests and the canvas benchmark: installed through apt when it is
// missing and this is root (Playwright's own browser download is not allowed here). Builtins only,
// because `npm test` calls it before anything else is known to be installed.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';

export const CHROMIUM = '/usr/bin/chromium';

export function ensureChromium(log) {
	if (fs.existsSync(CHROMIUM)) return;
	if (process.getuid?.() !== 0) {
		throw new Error("Headless Chromium is needed (browser tests, canvas benchmark): sudo apt-get install chromium");
	}
	log("Installing Debian's chromium (about a minute)…");
	const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
	for (const a of [['update'], ['install', '-y', '--no-install-recommends', 'chromium']]) {
		const r = spawnSync('apt-get', a, { stdio: 'inherit', env });
		if (r.status !== 0) throw new Error(`apt-get ${a.join(' ')} failed`);
	}
}
