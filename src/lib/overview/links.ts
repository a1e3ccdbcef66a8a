import { registerQueryToParams, type RegisterQuery } from '../specimen/query.ts';
import type { OverviewQuery } from './schema.ts';

/**
 * The register view behind a figure of the overview: the overview's own filters (its collection is
 * the register's department) plus the figure's, so following a number shows exactly those jars.
 */
export function registerHref(filters: OverviewQuery, figure: Partial<RegisterQuery> = {}): string {
	const params = registerQueryToParams({ department: filters.collection, location: filters.location, ...figure });
	const search = params.toString();
	return search ? `/specimens?${search}` : '/specimens';
}
