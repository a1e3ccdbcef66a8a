import fs from 'node:fs';
import path from 'node:path';
import { createRequire } from 'node:module';
import semver from 'semver';
import { describe, expect, it } from 'vitest';

/**
 * TESTPLAN D7, the dependency gate (ASVS 5.0 15.2.1 components free of known vulnerabilities): the
 * installed versions of the parts that handle untrusted input are at or above the first release that
 * fixed each advisory below. `npm audit` cannot be the gate here: this machine's registry answers its
 * advisory endpoint with 405. So each advisory the team has read is a row, with its source; a new
 * one is added as a row when it is published.
 */
const root = path.resolve(import.meta.dirname, '..', '..');
const require = createRequire(path.join(root, 'package.json'));
const installed = (name: string): string => JSON.parse(fs.readFileSync(path.join(root, 'node_modules', name, 'package.json'), 'utf8')).version;

const MINIMUMS: { name: string; atLeast: string; why: string }[] = [
	{ name: 'sharp', atLeast: '0.35.0', why: 'GHSA-f88m-g3jw-g9cj: libvips CVE-2026-33327, CVE-2026-33328, CVE-2026-35590, CVE-2026-35591 (TESTPLAN [SH])' },
	{ name: 'sharp', atLeast: '0.32.6', why: 'CVE-2023-4863, libwebp heap overflow (TESTPLAN [SH])' },
	{ name: '@tus/server', atLeast: '2.4.3', why: 'upload ids that escape the storage directory (TESTPLAN [TS])' },
	{ name: '@tus/file-store', atLeast: '2.1.1', why: 'upload ids that escape the storage directory (TESTPLAN [TS])' },
];

describe('the dependency gate (TESTPLAN D7)', () => {
	it.each(MINIMUMS.map((m) => [`${m.name} ≥ ${m.atLeast}`, m] as const))('%s', (_label, m) => {
		expect(semver.gte(installed(m.name), m.atLeast), `${m.name} ${installed(m.name)}: ${m.why}`).toBe(true);
	});

	it('has one sharp and one libvips, the one the advisory fix ships (astro’s own sharp is overridden to ours)', () => {
		const copies: string[] = [];
		const walk = (dir: string, depth: number) => {
			if (depth > 6 || !fs.existsSync(dir)) return;
			for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
				if (!e.isDirectory()) continue;
				const p = path.join(dir, e.name);
				if (e.name === 'sharp' && fs.existsSync(path.join(p, 'package.json'))) copies.push(path.relative(root, p));
				if (e.name.startsWith('@')) walk(p, depth);
				else if (fs.existsSync(path.join(p, 'node_modules'))) walk(path.join(p, 'node_modules'), depth + 1);
			}
		};
		walk(path.join(root, 'node_modules'), 0);
		expect(copies).toEqual(['node_modules/sharp']);
		const vips = (require('sharp') as { versions: { vips: string } }).versions.vips;
		expect(semver.gte(semver.coerce(vips)!, '8.18.0'), `libvips ${vips}`).toBe(true);
	});

	it('keeps Lucia 3 (unmaintained since March 2025, TESTPLAN [LN]) behind one module, so leaving it is a one-file change', () => {
		expect(installed('lucia')).toBe('3.2.2');
		const importers: string[] = [];
		const walk = (dir: string) => {
			for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
				const p = path.join(dir, e.name);
				if (e.isDirectory()) walk(p);
				else if (/\.(ts|tsx|astro|mjs)$/.test(e.name) && /from ['"](lucia|@lucia-auth\/[^'"]+)['"]/.test(fs.readFileSync(p, 'utf8'))) importers.push(path.relative(root, p));
			}
		};
		for (const d of ['src', 'scripts', 'db']) walk(path.join(root, d));
		expect(importers).toEqual(['src/lib/server/auth/lucia.ts']);
	});
});
