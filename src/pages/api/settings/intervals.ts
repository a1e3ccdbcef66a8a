import type { APIRoute } from 'astro';
import { z } from 'zod';
import { json, readJson } from '../../../lib/server/http.ts';
import { intervals, setIntervals } from '../../../lib/server/checks/settings.ts';
import { audit } from '../../../lib/server/audit.ts';

/** Months to the next check for each overall grade; the administrator sets them. */
export const GET: APIRoute = async () => json({ intervals: await intervals() });

const months = z.number().int().min(1, 'At least 1 month.').max(120, 'At most 120 months.');
const Body = z.object({ good: months, fair: months, poor: months, unacceptable: months }).strict();

export const PUT: APIRoute = async ({ request, locals, clientAddress }) => {
	const body = await readJson(request, Body);
	if (!body.ok) return body.response;
	const before = await intervals();
	const after = await setIntervals(body.value);
	await audit({ action: 'settings.intervals', entityType: 'settings', entityId: 'grade-intervals', actorId: locals.user!.id, before, after, clientAddress });
	return json({ intervals: after });
};
