import { json, problem } from '../http.ts';
import { TreatmentError } from './errors.ts';
import { MaterialError } from './materials.ts';
import type { TreatmentActor } from './service.ts';

/** The signed-in user as the treatment rules see them. */
export function actorOf(locals: App.Locals, clientAddress: string): TreatmentActor {
	const u = locals.user!;
	return { id: u.id, role: u.role, clientAddress };
}

/** Runs a treatment operation and maps its refusals to their HTTP answers. */
export async function answer(run: () => Promise<unknown>, status = 200): Promise<Response> {
	try {
		return json(await run(), status);
	} catch (err) {
		if (err instanceof TreatmentError) {
			if (err.current) return json({ error: err.message, fields: [], current: err.current }, err.status);
			if (err.problems.length > 0) return json({ error: err.message, fields: [], problems: err.problems }, err.status);
			return problem(err.status, err.message);
		}
		if (err instanceof MaterialError) return problem(err.status, err.message);
		throw err;
	}
}
