import { defineMiddleware, sequence } from 'astro:middleware';
import { decide } from './lib/auth/permissions.ts';
import { checkSession, blankCookie, sessionCookieName } from './lib/server/auth/lucia.ts';
import { isCrossSite, securityHeaders, withHeaders } from './lib/server/security.ts';
import { config } from './lib/server/config.ts';
import { startOutboxWorker } from './lib/server/mail/outbox.ts';
import { audit } from './lib/server/audit.ts';
import { db } from './lib/server/db.ts';
import { forbiddenPage } from './lib/server/pages.ts';
import { setAuthCookie } from './lib/server/cookies.ts';
import { isDatabaseUnavailable, UNAVAILABLE_MESSAGE } from './lib/server/dbErrors.ts';

// Every request: security headers, the same-origin rule for changes, then who is asking and whether
// the route's rule (src/lib/auth/permissions.ts) lets them. Deny by default: a route without a rule
// is refused for everybody.

/** Binds the models to the connection and starts the mail sender, once per process. */
const init = defineMiddleware((_ctx, next) => {
	db();
	startOutboxWorker();
	return next();
});

const isApi = (path: string) => path === '/api' || path.startsWith('/api/');

const headers = defineMiddleware(async (_ctx, next) => withHeaders(await next(), securityHeaders(config().secureCookies)));

/**
 * The database stopped, crashed or is restarting: answer 503 with Retry-After rather than 500. The
 * transaction the request was in is gone whole (PostgreSQL); the client may send it again.
 */
const unavailable = defineMiddleware(async (ctx, next) => {
	try {
		return await next();
	} catch (err) {
		if (!isDatabaseUnavailable(err)) throw err;
		console.error(`[db] ${ctx.request.method} ${ctx.url.pathname}: database unavailable (${(err as Error).message})`);
		const headers = { 'retry-after': '5', 'cache-control': 'no-store' };
		if (isApi(ctx.url.pathname)) return Response.json({ error: UNAVAILABLE_MESSAGE }, { status: 503, headers });
		return new Response(UNAVAILABLE_MESSAGE, { status: 503, headers: { ...headers, 'content-type': 'text/plain; charset=utf-8' } });
	}
});

const sameOrigin = defineMiddleware(async (ctx, next) => {
	if (isCrossSite(ctx.request, ctx.url.origin)) {
		await audit({
			action: 'request.cross-site-refused',
			entityType: 'route',
			entityId: ctx.routePattern,
			after: { method: ctx.request.method, origin: ctx.request.headers.get('origin') },
			clientAddress: ctx.clientAddress,
		}).catch(() => {});
		return new Response('Cross-site requests are refused.', { status: 403, headers: { 'content-type': 'text/plain' } });
	}
	return next();
});

const access = defineMiddleware(async (ctx, next) => {
	const sessionId = ctx.cookies.get(sessionCookieName())?.value;
	const check = await checkSession(sessionId);
	ctx.locals.user = check.user;
	ctx.locals.sessionId = check.user ? check.sessionId : null;
	if (sessionId && !check.user) setAuthCookie(ctx.cookies, blankCookie());
	const decision = decide(ctx.routePattern, ctx.request.method, check.user);
	if (decision.kind === 'allow') {
		const res = await next();
		// The route admitted the role but the record's own rules refused (another's draft, an approved
		// check, a reviewer editing marks): an authorisation failure, logged like one (ASVS 16.3.2).
		if (res.status === 403 && check.user) {
			await audit({
				action: 'access.refused',
				entityType: 'route',
				entityId: ctx.routePattern,
				actorId: check.user.id,
				after: { method: ctx.request.method, reason: 'record-rule', path: ctx.url.pathname.slice(0, 200) },
				clientAddress: ctx.clientAddress,
			}).catch(() => {});
		}
		return res;
	}
	const api = isApi(ctx.url.pathname);
	if (decision.kind === 'sign-in') {
		if (api) return Response.json({ error: 'Sign in first.' }, { status: 401 });
		const back = ctx.url.pathname + ctx.url.search;
		const why = check.user === null && check.reason !== 'none' ? `&why=${check.reason}` : '';
		return ctx.redirect(`/login?next=${encodeURIComponent(back)}${why}`, 302);
	}
	await audit({
		action: 'access.refused',
		entityType: 'route',
		entityId: ctx.routePattern ?? ctx.url.pathname.slice(0, 80),
		actorId: check.user?.id ?? null,
		after: { method: ctx.request.method, reason: decision.reason },
		clientAddress: ctx.clientAddress,
	});
	if (decision.reason === 'no-rule' && !check.user) {
		// Unknown addresses look the same to everybody signed out: go and sign in.
		if (api) return Response.json({ error: 'Sign in first.' }, { status: 401 });
		return ctx.redirect(`/login?next=${encodeURIComponent(ctx.url.pathname)}`, 302);
	}
	const [status, message] =
		decision.reason === 'no-rule'
			? [404, 'There is nothing at this address.']
			: decision.reason === 'method'
				? [405, 'That method is not allowed here.']
				: [403, 'Your role does not give access to this.'];
	if (api) return Response.json({ error: message }, { status });
	return forbiddenPage(message, status);
});

export const onRequest = sequence(init, headers, unavailable, sameOrigin, access);
