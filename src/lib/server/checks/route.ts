import { json, problem } from '../http.ts';
import { CheckError, type CheckActor } from './service.ts';

/** The signed-in user as the check workflow sees them. */
export function actorOf(locals: App.Locals, clientAddress: string): CheckActor {
	const u = locals.user!;
	return { id: u.id, role: u.role, clientAddress };
}

/** Runs a check operation and maps its refusals to their HTTP answers. */
export async function answer(run: () => Promise<unknown>, status = 200): Promise<Response> {
	try {
		return json(await run(), status);
	} catch (err) {
		if (err instanceof CheckError) return err.current ? json({ error: err.message, fields: [], current: err.current }, err.status) : problem(err.status, err.message);
		throw err;
	}
}
