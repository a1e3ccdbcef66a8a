import type { AstroCookies, AstroCookieSetOptions } from 'astro';
import type { CookieSpec } from './auth/lucia.ts';

/** Sets a cookie made by the auth module on Astro's cookie jar; always HttpOnly. */
export function setAuthCookie(cookies: AstroCookies, c: CookieSpec): void {
	cookies.set(c.name, c.value, { ...(c.attributes as AstroCookieSetOptions), httpOnly: true });
}
