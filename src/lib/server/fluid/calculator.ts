import type { APIRoute } from 'astro';
import type { z } from 'zod';
import { json, problem, readJson } from '../http.ts';

/**
 * An API route for one of the fluid calculators: validates the JSON body with the shared schema,
 * runs the pure computation, and turns its RangeError (input outside the range of validity) into a
 * 400 whose message says what is wrong. Nothing is stored.
 */
export function calculator<S extends z.ZodType>(schema: S, compute: (input: z.output<S>) => unknown): APIRoute {
	return async ({ request }) => {
		const body = await readJson(request, schema);
		if (!body.ok) return body.response;
		try {
			return json(compute(body.value));
		} catch (err) {
			if (err instanceof RangeError) return problem(400, err.message);
			throw err;
		}
	};
}
