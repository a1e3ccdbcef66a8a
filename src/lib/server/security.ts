/**
 * Response headers for every response that passes the app (static files are served by the adapter
 * before it). Script and style sources are governed by Astro's hashed CSP (astro.config.mjs); the
 * header adds what a <meta> CSP cannot say (frame-ancestors) and the rest of ASVS 3.4.
 */
export const SECURITY_HEADERS: Record<string, string> = {
	'content-security-policy': "frame-ancestors 'none'; object-src 'none'; base-uri 'none'; form-action 'self'",
	'x-content-type-options': 'nosniff',
	'x-frame-options': 'DENY',
	'referrer-policy': 'same-origin',
	'cross-origin-opener-policy': 'same-origin',
	'permissions-policy': 'camera=(), microphone=(), geolocation=()',
	// Pages and API answers hold records that must not linger in shared caches (ASVS 14.3.2).
	'cache-control': 'no-store',
};

/**
 * The headers for a site at this public address: behind https, browsers are also told to come back
 * only over https for a year (HSTS, RFC 6797; ASVS 3.4.1). Over plain http the header would be
 * ignored (RFC 6797 §8.1), so a local or test site goes without it.
 */
export function securityHeaders(secure: boolean): Record<string, string> {
	return secure ? { ...SECURITY_HEADERS, 'strict-transport-security': 'max-age=31536000; includeSubDomains' } : SECURITY_HEADERS;
}

const UNSAFE = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/**
 * Refuses a state-changing request that did not come from a page of this site (ASVS 3.5). Astro's
 * own check covers form submissions only; this covers every content type, JSON and tus included.
 * Browsers send Origin on every cross-site and same-site unsafe request; other clients must too.
 */
export function isCrossSite(request: Request, siteOrigin: string): boolean {
	if (!UNSAFE.has(request.method.toUpperCase())) return false;
	const origin = request.headers.get('origin');
	if (origin) return origin !== siteOrigin;
	return request.headers.get('sec-fetch-site') !== 'same-origin';
}

/**
 * Sets headers the response does not have yet, even where its headers are immutable (e.g.
 * Response.redirect). A page's own CSP (Astro's script and style hashes) is kept and our
 * directives are appended to it.
 */
export function withHeaders(response: Response, headers: Record<string, string>): Response {
	const apply = (r: Response) => {
		for (const [k, v] of Object.entries(headers)) {
			const existing = r.headers.get(k);
			if (existing === null) r.headers.set(k, v);
			else if (k === 'content-security-policy') r.headers.set(k, `${existing.replace(/;\s*$/, '')}; ${v}`);
		}
		return r;
	};
	try {
		return apply(response);
	} catch {
		return apply(new Response(response.body, response));
	}
}
