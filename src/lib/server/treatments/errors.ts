import type { TreatmentView } from '../../treatment/view.ts';

/** A refusal of a treatment operation, with its HTTP status (and the current record after a 409). */
export class TreatmentError extends Error {
	constructor(
		readonly status: 400 | 403 | 404 | 409,
		message: string,
		readonly current?: TreatmentView,
		readonly problems: string[] = [],
	) {
		super(message);
	}
}
