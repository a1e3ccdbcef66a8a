import type { APIRoute } from 'astro';
import { json, problem, zodFields } from '../../lib/server/http.ts';
import { collectionOverview } from '../../lib/server/overview/overview.ts';
import { OverviewQuerySchema } from '../../lib/overview/schema.ts';

/** The collection overview, for the jars of one collection and one location when they are given. */
export const GET: APIRoute = async ({ url }) => {
	const q = OverviewQuerySchema.safeParse(Object.fromEntries(url.searchParams));
	if (!q.success) return problem(400, 'Some values are not acceptable.', zodFields(q.error));
	return json(await collectionOverview(q.data));
};
