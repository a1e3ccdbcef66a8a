import type { APIRoute } from 'astro';
import { UniqueConstraintError } from 'sequelize';
import { z } from 'zod';
import { json, problem, readJson } from '../../lib/server/http.ts';
import { StorageLocation } from '../../lib/server/models/index.ts';
import { audit } from '../../lib/server/audit.ts';
import { locationView } from '../../lib/server/locations/service.ts';

/** The storage locations with their limits, for forms, filters and the Lists page; the administrator adds new ones. */
export const GET: APIRoute = async () => {
	const rows = await StorageLocation.findAll({ order: [['code', 'ASC']] });
	return json({ locations: rows.map(locationView) });
};

const LocationSchema = z
	.object({
		code: z.string().trim().min(1, 'Give a short code, e.g. SPR-A1.').max(40).regex(/^[A-Za-z0-9][A-Za-z0-9.\-/ ]*$/, 'Use letters, digits and . - / only.'),
		name: z.string().trim().min(1, 'Give a name.').max(200),
		notes: z.string().trim().max(2000).default(''),
	})
	.strict();

export const POST: APIRoute = async ({ request, locals, clientAddress }) => {
	const body = await readJson(request, LocationSchema);
	if (!body.ok) return body.response;
	try {
		const l = await StorageLocation.create(body.value);
		await audit({ action: 'location.create', entityType: 'location', entityId: l.id, actorId: locals.user!.id, after: body.value, clientAddress });
		return json({ location: locationView(l) }, 201);
	} catch (err) {
		if (err instanceof UniqueConstraintError) return problem(409, `A location with code ${body.value.code} exists already.`);
		throw err;
	}
};
