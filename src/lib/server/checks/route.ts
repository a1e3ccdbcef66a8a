import { answerOrRefuse, requestActor } from '../refusals.ts';
import { CheckError, type CheckActor } from './service.ts';

/** The signed-in user as the check workflow sees them. */
export const actorOf = (locals: App.Locals, clientAddress: string): CheckActor => requestActor(locals, clientAddress);

/** Runs a check operation and maps its refusals to their HTTP answers. */
export const answer = (run: () => Promise<unknown>, status = 200) => answerOrRefuse(run, status, [CheckError]);
