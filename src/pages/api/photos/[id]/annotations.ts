import type { APIRoute } from 'astro';
import { z } from 'zod';
import { json, problem, readJson } from '../../../../lib/server/http.ts';
import { getLayer, MarkError, saveLayer } from '../../../../lib/server/marks/service.ts';
import { User } from '../../../../lib/server/models/index.ts';
import { AnnotationImportError, exportAnnotations, importAnnotations } from '../../../../lib/marks/annotation.ts';
import { MAX_LAYER_BYTES, MarkLayerSchema } from '../../../../lib/marks/schema.ts';

/**
 * A photo's marks as W3C Web Annotations (an AnnotationPage of JSON-LD, SVG selectors on the
 * photo's IIIF image service), and importing such a page back as the photo's layer. Imported marks
 * new to this photo are credited to the person importing them, as any new mark is.
 */
const Id = z.uuid();
const ImportBody = z.object({ version: z.number().int().min(0), page: z.unknown() }).strict();

export const GET: APIRoute = async ({ params, locals, url }) => {
	const id = Id.safeParse(params.id);
	if (!id.success) return problem(404, 'No such photograph.');
	try {
		const { layer, photo } = await getLayer(id.data, locals.user!);
		const authors = new Map((await User.findAll({ attributes: ['id', 'name'], where: { id: [...new Set(layer.marks.map((m) => m.authorId))] } })).map((u) => [u.id, u.name]));
		const page = exportAnnotations(layer, { imageId: `${url.origin}/api/photos/${id.data}/tiles`, width: photo.width, height: photo.height, creatorName: (a) => authors.get(a) });
		return json(page, 200, { 'content-type': 'application/ld+json; profile="http://www.w3.org/ns/anno.jsonld"' });
	} catch (err) {
		if (err instanceof MarkError) return problem(err.status, err.message);
		throw err;
	}
};

export const POST: APIRoute = async ({ params, locals, request, clientAddress }) => {
	const id = Id.safeParse(params.id);
	if (!id.success) return problem(404, 'No such photograph.');
	const body = await readJson(request, ImportBody, MAX_LAYER_BYTES * 2);
	if (!body.ok) return body.response;
	const user = locals.user!;
	try {
		const current = await getLayer(id.data, user);
		const { layer, warnings } = importAnnotations(body.value.page, { authorId: user.id });
		const known = new Set(current.layer.marks.map((m) => m.id));
		const credited = MarkLayerSchema.parse({ ...layer, marks: layer.marks.map((m) => (known.has(m.id) ? m : { ...m, authorId: user.id })) });
		const saved = await saveLayer(id.data, user, body.value.version, credited, clientAddress);
		return json({ ...saved, warnings });
	} catch (err) {
		if (err instanceof AnnotationImportError) return problem(400, err.message);
		if (err instanceof MarkError) return err.current ? json({ error: err.message, fields: [], current: err.current }, err.status) : problem(err.status, err.message);
		throw err;
	}
};
