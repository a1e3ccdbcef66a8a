// `npm test`: its own set-up (dependencies; PostgreSQL and Chromium from Debian when missing and
// root), then every test in one vitest run (unit, integration against a throwaway PostgreSQL, and
// browser tests in headless Chromium against the built server), then one summary line.
// Extra arguments go to vitest, e.g. `npm test -- tests/unit` or `npm test -- -t "sign-in"`.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { ensureDeps } from './lib/deps.mjs';
import { ensureChromium } from './lib/chromium.mjs';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const log = (m) => console.log(`[test] ${m}`);
process.env.ASTRO_TELEMETRY_DISABLED = '1';
const args = process.argv.slice(2);
const unitOnly = process.env.MENISCUS_TEST_SCOPE === 'unit';

ensureDeps(root, log);
if (!unitOnly) {
	const { findPgBin } = await import('../db/cluster.mjs');
	await findPgBin({ install: true, log });
	ensureChromium(log);
}

const report = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'meniscus-report-')), 'vitest.json');
const run = spawnSync(
	path.join(root, 'node_modules', '.bin', 'vitest'),
	['run', '--reporter=default', '--reporter=json', `--outputFile.json=${report}`, ...args],
	{ cwd: root, stdio: 'inherit', env: process.env },
);
let counts = null;
try {
	const r = JSON.parse(fs.readFileSync(report, 'utf8'));
	counts = { passed: r.numPassedTests, failed: r.numFailedTests, skipped: r.numPendingTests + r.numTodoTests };
} catch {
	// No report: vitest itself failed before running tests (set-up error); its output says why.
}
if (counts) console.log(`\nSummary: ${counts.passed} passed, ${counts.failed} failed, ${counts.skipped} skipped`);
else console.log('\nSummary: 0 passed, 1 failed (the test run did not complete; see above)');
const ok = run.status === 0 && counts && counts.failed === 0 && counts.passed > 0;
process.exit(ok ? 0 : 1);
