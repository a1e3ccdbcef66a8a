import type { APIRoute } from 'astro';
import { z } from 'zod';
import { problem } from '../../../../lib/server/http.ts';
import { comparisonSources } from '../../../../lib/server/compare/sources.ts';
import { answer } from '../../../../lib/server/compare/route.ts';

/** The photographs of a specimen that can be compared, newest first, with their checks and mark layers. */
export const GET: APIRoute = async ({ params, locals }) => {
	const id = z.uuid().safeParse(params.id);
	if (!id.success) return problem(404, 'No such specimen.');
	return answer(() => comparisonSources(id.data, locals.user!));
};
