import type { APIRoute } from 'astro';
import { json } from '../../lib/server/http.ts';
import { StorageLocation } from '../../lib/server/models/index.ts';

/** The storage locations, for forms and filters. */
export const GET: APIRoute = async () => {
	const rows = await StorageLocation.findAll({ order: [['code', 'ASC']] });
	return json({ locations: rows.map((l) => ({ id: l.id, code: l.code, name: l.name })) });
};
