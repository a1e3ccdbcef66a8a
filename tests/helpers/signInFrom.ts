import http from 'node:http';
import { baseUrl } from './server.ts';

/**
 * A POST to /login from a chosen loopback address (the whole of 127.0.0.0/8 reaches this machine,
 * so 127.0.0.2 is "another computer" to the app's per-address throttle), with the cookies a browser
 * would bring. Answers the status and the cookies set, as "name=value".
 */
export interface SignInAnswer {
	status: number;
	cookies: Record<string, string>;
}

export function signInFrom(email: string, password: string, opts: { from?: string; cookie?: string; base?: string } = {}): Promise<SignInAnswer> {
	const u = new URL(opts.base ?? baseUrl());
	const body = new URLSearchParams({ email, password }).toString();
	const headers: Record<string, string> = {
		origin: u.origin,
		'content-type': 'application/x-www-form-urlencoded',
		'content-length': String(Buffer.byteLength(body)),
		...(opts.cookie ? { cookie: opts.cookie } : {}),
	};
	return new Promise((resolve, reject) => {
		const req = http.request({ host: u.hostname, port: u.port, path: '/login', method: 'POST', headers, localAddress: opts.from, agent: false }, (res) => {
			res.resume();
			res.on('end', () => {
				const cookies: Record<string, string> = {};
				for (const c of res.headers['set-cookie'] ?? []) {
					const [pair] = c.split(';');
					const eq = pair!.indexOf('=');
					cookies[pair!.slice(0, eq)] = pair!.slice(eq + 1);
				}
				resolve({ status: res.statusCode ?? 0, cookies });
			});
			res.on('error', reject);
		});
		req.on('error', reject);
		req.end(body);
	});
}

/** The device cookie of a sign-in answer as a Cookie header value, or throws. */
export function deviceCookieOf(a: SignInAnswer): string {
	const value = a.cookies.meniscus_device;
	if (!value) throw new Error(`no device cookie in the answer (status ${a.status})`);
	return `meniscus_device=${value}`;
}
