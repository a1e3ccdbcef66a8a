import type { APIRoute } from 'astro';
import { json, problem, zodFields } from '../../lib/server/http.ts';
import { SecurityQuerySchema, toJsonLines } from '../../lib/audit/security.ts';
import { securityEvents } from '../../lib/server/securityLog.ts';

/**
 * The security log for administrators: JSON pages for the screen, or JSON Lines (one event per
 * line, UTC times) to hand to a log collector.
 */
export const GET: APIRoute = async ({ url }) => {
	const q = SecurityQuerySchema.safeParse(Object.fromEntries(url.searchParams));
	if (!q.success) return problem(400, 'Some filters are not acceptable.', zodFields(q.error));
	const page = await securityEvents(q.data);
	if (q.data.format === 'json') return json(page);
	const stamp = new Date().toISOString().slice(0, 19).replace(/[:T]/g, '-');
	return new Response(toJsonLines(page.events), {
		headers: {
			'content-type': 'application/x-ndjson; charset=utf-8',
			'content-disposition': `attachment; filename="meniscus-security-${stamp}.jsonl"`,
			'x-next-before': page.next === null ? '' : String(page.next),
		},
	});
};
