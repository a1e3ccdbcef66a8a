import type { APIRoute } from 'astro';
import { User } from '../../../lib/server/models/index.ts';
import { db } from '../../../lib/server/db.ts';
import { json, problem, readJson } from '../../../lib/server/http.ts';
import { CreateUserSchema } from '../../../lib/users/schema.ts';
import { userView } from '../../../lib/server/users/presenter.ts';
import { AccountError, createUser } from '../../../lib/server/users/accounts.ts';

/** Users: the list, and creating one (an invitation e-mail goes out with a link to set a password). */
export const GET: APIRoute = async () => {
	db();
	const users = await User.findAll({ order: [['disabled', 'ASC'], ['name', 'ASC']] });
	return json({ users: users.map(userView) });
};

export const POST: APIRoute = async ({ request, locals, url, clientAddress }) => {
	const body = await readJson(request, CreateUserSchema);
	if (!body.ok) return body.response;
	try {
		const user = await createUser({ id: locals.user!.id, clientAddress }, body.value, url.origin);
		return json({ user }, 201);
	} catch (err) {
		if (err instanceof AccountError) return problem(err.status, err.message);
		throw err;
	}
};
