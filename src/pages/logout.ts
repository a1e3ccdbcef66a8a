import type { APIRoute } from 'astro';
import { blankCookie, endSession } from '../lib/server/auth/lucia.ts';
import { setAuthCookie } from '../lib/server/cookies.ts';
import { audit } from '../lib/server/audit.ts';

/** Sign-out deletes the session on the server (ASVS 7.4.1), not only the cookie. POST only. */
export const POST: APIRoute = async ({ locals, cookies, redirect, clientAddress }) => {
	if (locals.sessionId) {
		await endSession(locals.sessionId);
		await audit({ action: 'sign-out', entityType: 'user', entityId: locals.user?.id ?? null, actorId: locals.user?.id ?? null, clientAddress });
	}
	setAuthCookie(cookies, blankCookie());
	return redirect('/login', 303);
};
