/// <reference types="vitest/config" />
import { getViteConfig } from 'astro/config';

/**
 * `npm test` covers unit, integration and browser tests; `npm run test:reliability` runs the heavier
 * load, fault and restore suites in tests/reliability (MENISCUS_TEST_SCOPE=reliability). The global setup gives integration and
 * browser tests a throwaway PostgreSQL, the built app and a fake mail server; unit-only runs
 * (`npm run test:unit`) skip it.
 */
export default getViteConfig({
	test: {
		include:
			process.env.MENISCUS_TEST_SCOPE === 'reliability'
				? ['tests/reliability/**/*.test.ts']
				: ['tests/unit/**/*.test.ts', 'tests/integration/**/*.test.ts', 'tests/browser/**/*.test.ts'],
		globalSetup: ['tests/setup/global.ts'],
		testTimeout: 30_000,
		hookTimeout: 180_000,
		pool: 'forks',
		// Two cores: integration and browser files share one server; keep the load on it modest.
		maxWorkers: 2,
		minWorkers: 1,
		// The reliability files load, break and restore the machine on purpose: one at a time, so
		// none measures another's load.
		fileParallelism: process.env.MENISCUS_TEST_SCOPE !== 'reliability',
	},
});
