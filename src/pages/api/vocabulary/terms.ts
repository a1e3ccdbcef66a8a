import type { APIRoute } from 'astro';
import { z } from 'zod';
import { json, problem, readJson } from '../../../lib/server/http.ts';
import { DamageTerm } from '../../../lib/server/models/index.ts';
import { vocabulary } from '../../../lib/server/checks/settings.ts';
import { audit } from '../../../lib/server/audit.ts';
import { PARTS } from '../../../lib/check/vocabulary.ts';

/** The damage terms per part; an administrator adds terms the collection needs. */
export const GET: APIRoute = async () => json({ terms: await vocabulary() });

const AddTerm = z.object({ part: z.enum(PARTS), term: z.string().trim().toLowerCase().min(2, 'A term has at least 2 characters.').max(60) }).strict();

export const POST: APIRoute = async ({ request, locals, clientAddress }) => {
	const body = await readJson(request, AddTerm);
	if (!body.ok) return body.response;
	const { part, term } = body.value;
	if ((await vocabulary())[part].includes(term)) return problem(409, `“${term}” is in the ${part} vocabulary already.`);
	const t = await DamageTerm.create({ part, term });
	await audit({ action: 'vocabulary.add', entityType: 'damage-term', entityId: t.id, actorId: locals.user!.id, after: { part, term }, clientAddress });
	return json({ terms: await vocabulary() }, 201);
};
