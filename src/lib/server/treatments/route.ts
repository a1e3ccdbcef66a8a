import { answerOrRefuse, requestActor } from '../refusals.ts';
import { TreatmentError } from './errors.ts';
import { MaterialError } from './materials.ts';
import type { TreatmentActor } from './service.ts';

/** The signed-in user as the treatment rules see them. */
export const actorOf = (locals: App.Locals, clientAddress: string): TreatmentActor => requestActor(locals, clientAddress);

/** Runs a treatment operation and maps its refusals to their HTTP answers. */
export const answer = (run: () => Promise<unknown>, status = 200) => answerOrRefuse(run, status, [TreatmentError, MaterialError]);
