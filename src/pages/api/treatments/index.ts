import type { APIRoute } from 'astro';
import { z } from 'zod';
import { problem } from '../../../lib/server/http.ts';
import { treatmentList } from '../../../lib/server/treatments/service.ts';
import { actorOf, answer } from '../../../lib/server/treatments/route.ts';

/** `?view=queue`: risk assessments waiting for sign-off, oldest first; `?view=mine`: my open treatments. */
export const GET: APIRoute = async ({ url, locals, clientAddress }) => {
	const view = z.enum(['mine', 'queue']).safeParse(url.searchParams.get('view'));
	if (!view.success) return problem(400, 'Ask for view=mine or view=queue.');
	return answer(async () => ({ treatments: await treatmentList(view.data, actorOf(locals, clientAddress)) }));
};
