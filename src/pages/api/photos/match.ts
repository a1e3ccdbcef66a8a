import type { APIRoute } from 'astro';
import { z } from 'zod';
import { json, readJson } from '../../../lib/server/http.ts';
import { Specimen } from '../../../lib/server/models/index.ts';
import { matchFileNames } from '../../../lib/photos/matching.ts';
import { MAX_FILES_PER_BATCH } from '../../../lib/photos/limits.ts';

/**
 * Batch matching: the names of files dropped on the register, each matched to a specimen by the
 * object number in it. The object numbers come from the whole register, so the match is the same
 * whatever page of the register the files were dropped on.
 */
const Body = z.object({ fileNames: z.array(z.string().min(1).max(255)).min(1).max(MAX_FILES_PER_BATCH) }).strict();

export const POST: APIRoute = async ({ request }) => {
	const body = await readJson(request, Body);
	if (!body.ok) return body.response;
	const specimens = await Specimen.findAll({ attributes: ['id', 'objectNumber', 'title'], raw: true });
	const byNumber = new Map(specimens.map((s) => [s.objectNumber, s]));
	const matches = matchFileNames(body.value.fileNames, [...byNumber.keys()]).map((m) => {
		const s = m.objectNumber ? byNumber.get(m.objectNumber) : undefined;
		return { ...m, specimen: s ? { id: s.id, objectNumber: s.objectNumber, title: s.title } : null };
	});
	return json({ matches });
};
