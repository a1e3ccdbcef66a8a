import { json, problem } from '../http.ts';
import { CompareError } from './error.ts';
import type { CompareActor } from './service.ts';

/** The signed-in user with the address the audit trail records. */
export function actorOf(locals: App.Locals, clientAddress: string): CompareActor {
	return { ...locals.user!, clientAddress };
}

/** Runs a comparison operation and maps its refusals to HTTP answers (a 409 carries `current`). */
export async function answer(run: () => Promise<unknown>, status = 200): Promise<Response> {
	try {
		return json(await run(), status);
	} catch (err) {
		if (!(err instanceof CompareError)) throw err;
		return err.current ? json({ error: err.message, fields: [], current: err.current }, err.status) : problem(err.status, err.message);
	}
}
