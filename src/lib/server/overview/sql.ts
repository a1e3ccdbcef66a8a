import { FLAMMABLE_KINDS } from '../../overview/inventory.ts';

/**
 * SQL spellings of rules the pure modules state, for queries that must agree with them: which
 * jars count as flammable (overview/inventory.ts flammableClass) and which checks a trend may use.
 * Built from constants only (never from input), with the table alias of the query that uses them.
 */
const kinds = FLAMMABLE_KINDS.map((k) => `'${k}'`).join(', ');

/** flammableClass() = 'spirit'. */
export const spiritSql = (s: string) => `(${s}.preservative_kind IN (${kinds}) OR ${s}.hazards @> '[{"flag":"flammable-spirit"}]'::jsonb)`;

/** flammableClass() = 'presumed'. */
export const presumedSql = (s: string) => `(NOT ${spiritSql(s)} AND (${s}.preservative_kind = 'unknown' OR ${s}.hazards @> '[{"flag":"unknown-fluid"}]'::jsonb))`;

/** flammableClass() is not null: the jars a store's flammable total counts. */
export const countedFlammableSql = (s: string) => `(${spiritSql(s)} OR ${s}.preservative_kind = 'unknown' OR ${s}.hazards @> '[{"flag":"unknown-fluid"}]'::jsonb)`;

/**
 * A check whose fluid readings can be trusted for a trend or a latest level: approved, and not
 * corrected by a later approved check (a correction replaces it; src/lib/history/timeline.ts).
 */
export const trustedCheckSql = (c: string) =>
	`(${c}.state = 'approved' AND NOT EXISTS (SELECT 1 FROM condition_checks k WHERE k.corrects_check_id = ${c}.id AND k.state = 'approved'))`;
