import type { APIRoute } from 'astro';
import { z } from 'zod';
import { problem } from '../../../lib/server/http.ts';
import { checkList, previousApproved } from '../../../lib/server/checks/service.ts';
import { actorOf, answer } from '../../../lib/server/checks/route.ts';

/** `?view=mine`: my drafts and returned checks; `?view=queue`: checks waiting for review, oldest first, with the previous grade. */
export const GET: APIRoute = async ({ url, locals, clientAddress }) => {
	const view = z.enum(['mine', 'queue']).safeParse(url.searchParams.get('view'));
	if (!view.success) return problem(400, 'Ask for view=mine or view=queue.');
	return answer(async () => {
		const checks = await checkList(view.data, actorOf(locals, clientAddress));
		// The queue also says what changed since the specimen's previous approved check.
		return view.data === 'queue' ? { checks, previous: await previousApproved(checks) } : { checks };
	});
};
