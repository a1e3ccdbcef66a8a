import type { APIRoute } from 'astro';
import { z } from 'zod';
import { problem, readJson } from '../../../lib/server/http.ts';
import { MaterialPatchSchema, updateMaterial } from '../../../lib/server/treatments/materials.ts';
import { actorOf, answer } from '../../../lib/server/treatments/route.ts';

/** An administrator changes a material's name, cure period or note, or takes it off the pick lists. */
export const PATCH: APIRoute = async ({ params, request, locals, clientAddress }) => {
	const id = z.uuid().safeParse(params.id);
	if (!id.success) return problem(404, 'No such material.');
	const body = await readJson(request, MaterialPatchSchema);
	if (!body.ok) return body.response;
	return answer(async () => ({ material: await updateMaterial(actorOf(locals, clientAddress), id.data, body.value) }));
};
