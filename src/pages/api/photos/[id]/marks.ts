import type { APIRoute } from 'astro';
import { z } from 'zod';
import { json, problem, readJson } from '../../../../lib/server/http.ts';
import { getLayer, MarkError, saveLayer } from '../../../../lib/server/marks/service.ts';
import { MarkLayerSchema, MAX_LAYER_BYTES } from '../../../../lib/marks/schema.ts';

/**
 * A photograph's mark layer: GET it (with what the caller may do with it), PUT the whole layer
 * back naming the version it was loaded at. A stale version gets 409 with the layer as it now is.
 */
const Id = z.uuid();
const Body = z.object({ version: z.number().int().min(0).max(2_000_000_000), layer: MarkLayerSchema }).strict();

async function run(fn: () => Promise<unknown>): Promise<Response> {
	try {
		return json(await fn());
	} catch (err) {
		if (err instanceof MarkError) return err.current ? json({ error: err.message, fields: [], current: err.current }, err.status) : problem(err.status, err.message);
		throw err;
	}
}

export const GET: APIRoute = async ({ params, locals }) => {
	const id = Id.safeParse(params.id);
	if (!id.success) return problem(404, 'No such photograph.');
	return run(() => getLayer(id.data, locals.user!));
};

export const PUT: APIRoute = async ({ params, locals, request, clientAddress }) => {
	const id = Id.safeParse(params.id);
	if (!id.success) return problem(404, 'No such photograph.');
	const body = await readJson(request, Body, MAX_LAYER_BYTES);
	if (!body.ok) return body.response;
	return run(() => saveLayer(id.data, locals.user!, body.value.version, body.value.layer, clientAddress));
};
