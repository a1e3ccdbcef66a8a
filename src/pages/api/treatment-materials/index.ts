import type { APIRoute } from 'astro';
import { readJson } from '../../../lib/server/http.ts';
import { createMaterial, listMaterials, MaterialBodySchema } from '../../../lib/server/treatments/materials.ts';
import { actorOf, answer } from '../../../lib/server/treatments/route.ts';

/** The materials list: everyone signed in reads the active ones (administrators may ask for all); administrators add. */
export const GET: APIRoute = async ({ url, locals }) => {
	const all = url.searchParams.get('all') === '1' && locals.user!.role === 'admin';
	return answer(async () => ({ materials: await listMaterials(all) }));
};

export const POST: APIRoute = async ({ request, locals, clientAddress }) => {
	const body = await readJson(request, MaterialBodySchema);
	if (!body.ok) return body.response;
	return answer(async () => ({ material: await createMaterial(actorOf(locals, clientAddress), body.value) }), 201);
};
