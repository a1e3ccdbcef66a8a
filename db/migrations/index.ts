import * as foundation from './20261201000000-foundation.ts';
import * as checks from './20261202000000-condition-checks.ts';
import * as photographs from './20261203000000-photographs.ts';
import * as markLayers from './20261204000000-mark-layers.ts';
import * as storeLimits from './20261205000000-store-limits.ts';
import * as specimenTop from './20261205000100-specimen-top.ts';
import * as correctionsIndex from './20261205000200-check-corrections-index.ts';
import * as comparisons from './20261206000000-comparisons.ts';
import * as mailPreferences from './20261207000000-mail-preferences.ts';
import * as treatments from './20261208000000-treatments.ts';
import * as securityLog from './20261209000000-security-log.ts';

/**
 * Every migration, in order. Listed by static import rather than found by a file glob, so that
 * they load under any TypeScript loader (tsx for `npm start`, vite-node in the tests); a unit test
 * checks that each file in this folder is listed here.
 */
export const MIGRATIONS = [
	{ name: '20261201000000-foundation.ts', ...foundation },
	{ name: '20261202000000-condition-checks.ts', ...checks },
	{ name: '20261203000000-photographs.ts', ...photographs },
	{ name: '20261204000000-mark-layers.ts', ...markLayers },
	{ name: '20261205000000-store-limits.ts', ...storeLimits },
	{ name: '20261205000100-specimen-top.ts', ...specimenTop },
	{ name: '20261205000200-check-corrections-index.ts', ...correctionsIndex },
	{ name: '20261206000000-comparisons.ts', ...comparisons },
	{ name: '20261207000000-mail-preferences.ts', ...mailPreferences },
	{ name: '20261208000000-treatments.ts', ...treatments },
	{ name: '20261209000000-security-log.ts', ...securityLog },
];
