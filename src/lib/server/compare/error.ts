import type { ComparisonView } from '../../compare/view.ts';

/** A request about comparisons that cannot be answered as asked; `current` on a stale save (409). */
export class CompareError extends Error {
	constructor(
		readonly status: 400 | 404 | 409,
		message: string,
		readonly current?: ComparisonView,
	) {
		super(message);
	}
}
