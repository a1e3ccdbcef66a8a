import type { APIRoute } from 'astro';
import { json, readJson } from '../../../lib/server/http.ts';
import { mailPreferences, updateMailPreferences } from '../../../lib/server/mail/preferences.ts';
import { MailPreferencesPatchSchema } from '../../../lib/mail/preferences.ts';

/** The signed-in person's own choice of optional mail; nobody reads or changes another's. */
export const GET: APIRoute = async ({ locals }) => json({ preferences: await mailPreferences(locals.user!.id) });

export const PATCH: APIRoute = async ({ request, locals, clientAddress }) => {
	const body = await readJson(request, MailPreferencesPatchSchema);
	if (!body.ok) return body.response;
	return json({ preferences: await updateMailPreferences({ id: locals.user!.id, clientAddress }, body.value) });
};
