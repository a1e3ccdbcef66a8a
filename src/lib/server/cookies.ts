import type { AstroCookies, AstroCookieSetOptions } from 'astro';
import type { CookieSpec } from './auth/lucia.ts';

/**
 * Sets a cookie made by the auth module on Astro's cookie jar; always HttpOnly. A session cookie is
 * sent without Max-Age (Lucia would give it 400 days), so it ends with the browser and never
 * outlives what the server allows; the server's idle and absolute limits decide the rest. A blank
 * cookie keeps its Max-Age of 0, which tells the browser to delete it.
 */
export function setAuthCookie(cookies: AstroCookies, c: CookieSpec): void {
	const { maxAge, expires, ...rest } = c.attributes as AstroCookieSetOptions;
	const lifetime = c.value === '' ? { maxAge, expires } : {};
	cookies.set(c.name, c.value, { ...rest, ...lifetime, httpOnly: true });
}
