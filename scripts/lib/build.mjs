// The production build, redone only when its inputs changed: a SHA-256 over every file that goes
// into it (sources, config, lock file) and the build-time settings.
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

const INPUTS = ['src', 'public', 'astro.config.mjs', 'tailwind.config.mjs', 'tsconfig.json', 'package-lock.json'];

function hashInputs(root) {
	const h = createHash('sha256');
	const walk = (p) => {
		const st = fs.statSync(p);
		if (st.isDirectory()) for (const e of fs.readdirSync(p).sort()) walk(path.join(p, e));
		else h.update(path.relative(root, p)).update('\0').update(fs.readFileSync(p)).update('\0');
	};
	for (const i of INPUTS) if (fs.existsSync(path.join(root, i))) walk(path.join(root, i));
	h.update(process.env.MENISCUS_ALLOWED_HOSTS ?? '');
	// Builds before this line existed may have been made under vitest (NODE_ENV=test): never reuse them.
	h.update('\0production');
	return h.digest('hex');
}

export function ensureBuild(root, log = console.log) {
	const stamp = path.join(root, 'dist', '.meniscus-build-sha256');
	const want = hashInputs(root);
	const entry = path.join(root, 'dist', 'server', 'entry.mjs');
	if (fs.existsSync(entry) && fs.existsSync(stamp) && fs.readFileSync(stamp, 'utf8') === want) return false;
	log('Building the app (about 20 seconds)…');
	const r = spawnSync(path.join(root, 'node_modules', '.bin', 'astro'), ['build'], {
		cwd: root,
		stdio: ['ignore', 'pipe', 'inherit'],
		// Always the production build: under vitest NODE_ENV is "test", and Vite then bundles React's
		// development build, which ran the mark canvas at half speed (bench/canvas.ts) in the tests
		// and in any `npm start` that reused the tests' build.
		env: { ...process.env, NODE_ENV: 'production', ASTRO_TELEMETRY_DISABLED: '1' },
	});
	if (r.status !== 0) {
		process.stderr.write(r.stdout);
		throw new Error('The build failed; see the messages above.');
	}
	fs.writeFileSync(stamp, want);
	return true;
}
