import type { APIRoute } from 'astro';
import { z } from 'zod';
import { json, problem } from '../../../../lib/server/http.ts';
import { AccountError, resendInvitation } from '../../../../lib/server/users/accounts.ts';

/** Sends a fresh invitation link (the earlier one stops working). */
export const POST: APIRoute = async ({ params, locals, url, clientAddress }) => {
	const id = z.uuid().safeParse(params.id);
	if (!id.success) return problem(404, 'No such user.');
	try {
		await resendInvitation({ id: locals.user!.id, clientAddress }, id.data, url.origin);
		return json({ sent: true }, 202);
	} catch (err) {
		if (err instanceof AccountError) return problem(err.status, err.message);
		throw err;
	}
};
