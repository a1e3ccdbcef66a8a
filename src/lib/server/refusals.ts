import { json, problem } from './http.ts';

/**
 * How a service's refusals become HTTP answers, shared by the checks, comparisons and treatments
 * routes: an error class carrying a status and a message (and, after a stale save, the record as it
 * now is; or the list of what stands in the way) maps to its JSON answer; anything else is a fault
 * and propagates.
 */
export interface Refusal {
	status: number;
	message: string;
	current?: unknown;
	problems?: readonly string[];
}

type RefusalClass = abstract new (...args: never[]) => Refusal;

export async function answerOrRefuse(run: () => Promise<unknown>, status: number, refusals: readonly RefusalClass[]): Promise<Response> {
	try {
		return json(await run(), status);
	} catch (err) {
		if (!refusals.some((R) => err instanceof R)) throw err;
		const r = err as Refusal;
		if (r.current) return json({ error: r.message, fields: [], current: r.current }, r.status);
		if (r.problems?.length) return json({ error: r.message, fields: [], problems: r.problems }, r.status);
		return problem(r.status, r.message);
	}
}

/** The signed-in user as a service's rules see them, with the address the audit trail records. */
export function requestActor(locals: App.Locals, clientAddress: string): { id: string; role: NonNullable<App.Locals['user']>['role']; clientAddress: string } {
	const u = locals.user!;
	return { id: u.id, role: u.role, clientAddress };
}
