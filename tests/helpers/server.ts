import http from 'node:http';
import { inject } from 'vitest';
import { readMailbox, type MailboxMessage } from '../../src/lib/server/mail/fakeSmtp.ts';

/**
 * Talking to the app the global setup started, as a browser would: same-origin requests carry an
 * Origin header, cookies are passed by hand, redirects are not followed so they can be checked.
 */
export const baseUrl = () => inject('baseUrl');

let ownStack = false;

/** Points this test process's server modules (models, auth) at the test database. */
export function useTestDatabase(): void {
	// A file that runs a stack of its own (ownStack.ts) keeps its server modules pointed at that.
	if (ownStack) return;
	process.env.DATABASE_URL = inject('databaseUrl');
	process.env.MENISCUS_PUBLIC_URL = inject('baseUrl');
	process.env.MENISCUS_MAILBOX_DIR = inject('mailboxDir');
	process.env.MENISCUS_UPLOADS_DIR = inject('uploadsDir');
	// Mail this process queues (tests that call the server modules) goes to the same fake SMTP.
	process.env.SMTP_HOST = inject('serverEnv').SMTP_HOST!;
	process.env.SMTP_PORT = inject('serverEnv').SMTP_PORT!;
}

/**
 * Points this test process's server modules at a stack of the test's own (its database, uploads
 * folder and address) for the rest of the file, whatever later calls to useTestDatabase() ask.
 */
export function useOwnStack(env: { DATABASE_URL: string; MENISCUS_UPLOADS_DIR: string; MENISCUS_PUBLIC_URL: string }): void {
	useTestDatabase();
	ownStack = true;
	Object.assign(process.env, env);
}

export interface Req {
	method?: string;
	cookie?: string;
	json?: unknown;
	form?: Record<string, string>;
	/** A body sent exactly as given (hostile-input tests); its content type goes in `headers`. */
	raw?: string;
	origin?: string | null;
	headers?: Record<string, string>;
	/** Another app instance than the global one (fault tests start their own). */
	base?: string;
}

export async function call(path: string, r: Req = {}): Promise<Response> {
	const headers: Record<string, string> = { ...r.headers };
	const method = r.method ?? (r.json !== undefined || r.form || r.raw !== undefined ? 'POST' : 'GET');
	const root = r.base ?? baseUrl();
	if (r.origin !== null && method !== 'GET') headers.origin = r.origin ?? root;
	if (r.cookie) headers.cookie = r.cookie;
	let body: string | undefined = r.raw;
	if (r.json !== undefined) {
		headers['content-type'] = 'application/json';
		body = JSON.stringify(r.json);
	} else if (r.form) {
		headers['content-type'] = 'application/x-www-form-urlencoded';
		body = new URLSearchParams(r.form).toString();
	}
	return fetch(root + path, { method, headers, body, redirect: 'manual' });
}

/** The session cookie ("name=value") a response sets, or null. */
export function sessionCookie(res: Response): string | null {
	for (const c of res.headers.getSetCookie()) {
		const [pair] = c.split(';');
		if (pair && /session=/.test(pair) && !/=$/.test(pair) && !/=deleted$/.test(pair)) return pair;
	}
	return null;
}

export async function signIn(email: string, password = inject('demoPassword')): Promise<string> {
	const res = await call('/login', { form: { email, password } });
	const cookie = sessionCookie(res);
	if (res.status !== 303 || !cookie) throw new Error(`sign-in as ${email} failed: ${res.status}`);
	return cookie;
}

/** Waits for a message to `to` whose subject matches, as the fake SMTP server stored it. */
export async function waitForMail(to: string, subject: RegExp, ms = 15_000): Promise<MailboxMessage> {
	const until = Date.now() + ms;
	while (Date.now() < until) {
		const found = (await readMailbox(inject('mailboxDir'))).find((m) => m.envelopeTo.includes(to) && subject.test(m.subject));
		if (found) return found;
		await new Promise((r) => setTimeout(r, 200));
	}
	throw new Error(`no mail to ${to} matching ${subject} within ${ms} ms`);
}

export function linkIn(text: string): string {
	const m = text.match(/https?:\/\/\S+\/reset\/[A-Za-z0-9_-]+/);
	if (!m) throw new Error('no link in the message');
	return new URL(m[0]).pathname;
}

let n = 0;
/** A unique example.org address for a test's own user. */
export const uniqueEmail = (tag: string) => `${tag}-${process.pid}-${Date.now()}-${n++}@example.org`;

export interface RawAnswer {
	status: number;
	headers: http.IncomingHttpHeaders;
	body: string;
}

/**
 * A request whose path goes on the wire exactly as written (fetch would resolve `../` and re-encode
 * it), for the path-traversal tests. Unsafe methods carry the site's Origin, as call() sends it.
 */
export function rawRequest(method: string, path: string, headers: Record<string, string> = {}, body?: Buffer | string): Promise<RawAnswer> {
	const u = new URL(baseUrl());
	const all = { ...(method === 'GET' || method === 'HEAD' ? {} : { origin: u.origin }), ...headers, ...(body === undefined ? {} : { 'content-length': String(Buffer.byteLength(body)) }) };
	return new Promise((resolve, reject) => {
		const req = http.request({ host: u.hostname, port: u.port, path, method, headers: all }, (res) => {
			const chunks: Buffer[] = [];
			res.on('data', (c: Buffer) => chunks.push(c));
			res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks).toString('utf8') }));
			res.on('error', reject);
		});
		req.on('error', reject);
		req.end(body);
	});
}
