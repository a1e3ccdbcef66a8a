import { answerOrRefuse } from '../refusals.ts';
import { CompareError } from './error.ts';
import type { CompareActor } from './service.ts';

/** The signed-in user with the address the audit trail records. */
export function actorOf(locals: App.Locals, clientAddress: string): CompareActor {
	return { ...locals.user!, clientAddress };
}

/** Runs a comparison operation and maps its refusals to HTTP answers (a 409 carries `current`). */
export const answer = (run: () => Promise<unknown>, status = 200) => answerOrRefuse(run, status, [CompareError]);
