import type { APIRoute } from 'astro';
import { z } from 'zod';
import { json, problem, readJson } from '../../../lib/server/http.ts';
import { UpdateUserSchema } from '../../../lib/users/schema.ts';
import { AccountError, updateUser } from '../../../lib/server/users/accounts.ts';

/** Changing a user's name, role or disabled state; takes effect on their next request. */
export const PATCH: APIRoute = async ({ params, request, locals, clientAddress }) => {
	const id = z.uuid().safeParse(params.id);
	if (!id.success) return problem(404, 'No such user.');
	const body = await readJson(request, UpdateUserSchema);
	if (!body.ok) return body.response;
	try {
		return json({ user: await updateUser({ id: locals.user!.id, clientAddress }, id.data, body.value) });
	} catch (err) {
		if (err instanceof AccountError) return problem(err.status, err.message);
		throw err;
	}
};
