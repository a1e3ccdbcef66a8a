import type { z } from 'zod';

/**
 * JSON in and out of the API routes. Bodies are read with a size cap (the Node adapter has none,
 * TESTPLAN [AST]) and checked with the route's zod schema; any problem is a 4xx with a message a
 * person can act on, never a 500 and never a partial change.
 */
export const MAX_JSON_BYTES = 256 * 1024;

export function json(body: unknown, status = 200, headers: Record<string, string> = {}): Response {
	return new Response(JSON.stringify(body), {
		status,
		headers: { 'content-type': 'application/json; charset=utf-8', ...headers },
	});
}

export interface FieldError {
	path: string;
	message: string;
}

export function problem(status: number, message: string, fields: FieldError[] = []): Response {
	return json({ error: message, fields }, status);
}

export function zodFields(error: z.ZodError): FieldError[] {
	return error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
}

export type Parsed<T> = { ok: true; value: T } | { ok: false; response: Response };

/**
 * Reads a JSON body and validates it; refuses other content types, oversize and bad JSON. A route
 * that takes a whole file (the CSV import) names its own, larger cap.
 */
export async function readJson<S extends z.ZodType>(request: Request, schema: S, maxBytes = MAX_JSON_BYTES): Promise<Parsed<z.output<S>>> {
	const type = request.headers.get('content-type') ?? '';
	if (!/^application\/json\s*(;|$)/i.test(type)) {
		return { ok: false, response: problem(415, 'Send the body as application/json.') };
	}
	const declared = Number(request.headers.get('content-length') ?? '0');
	if (declared > maxBytes) return { ok: false, response: problem(413, 'The request body is too large.') };
	const text = await readCapped(request, maxBytes);
	if (text === null) return { ok: false, response: problem(413, 'The request body is too large.') };
	let data: unknown;
	try {
		data = JSON.parse(text);
	} catch {
		return { ok: false, response: problem(400, 'The request body is not valid JSON.') };
	}
	if (holdsUnstorableText(data)) return { ok: false, response: problem(400, 'Text cannot contain the NUL character (U+0000) or broken Unicode (a lone surrogate).') };
	const result = schema.safeParse(data);
	if (!result.success) {
		return { ok: false, response: problem(400, 'Some values are not acceptable.', zodFields(result.error)) };
	}
	return { ok: true, value: result.data };
}

/** U+0000, or half of a UTF-16 surrogate pair without its other half. */
const UNSTORABLE = /\u0000|[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/;

/**
 * Whether any string or key in a parsed body holds text PostgreSQL cannot store: U+0000 (text and
 * jsonb refuse it) or a lone surrogate (jsonb refuses its escape; text would get U+FFFD instead).
 * Either made the insert fail, a 500 instead of the 400 it deserves. Walked with a stack of its
 * own: a body may nest far deeper than the call stack goes.
 */
export function holdsUnstorableText(data: unknown): boolean {
	const stack: unknown[] = [data];
	while (stack.length > 0) {
		const v = stack.pop();
		if (typeof v === 'string') {
			if (UNSTORABLE.test(v)) return true;
		} else if (Array.isArray(v)) {
			for (const x of v) stack.push(x);
		} else if (v !== null && typeof v === 'object') {
			for (const [k, x] of Object.entries(v)) {
				if (UNSTORABLE.test(k)) return true;
				stack.push(x);
			}
		}
	}
	return false;
}

/** Reads an urlencoded or multipart form with the same cap, as a plain record of strings. */
export async function readForm(request: Request, maxBytes = 64 * 1024): Promise<Record<string, string> | null> {
	const declared = Number(request.headers.get('content-length') ?? '0');
	if (declared > maxBytes) return null;
	const type = request.headers.get('content-type') ?? '';
	if (!/^application\/x-www-form-urlencoded/i.test(type)) return null;
	const text = await readCapped(request, maxBytes);
	if (text === null) return null;
	const out: Record<string, string> = Object.create(null);
	for (const [k, v] of new URLSearchParams(text)) out[k] = v;
	return out;
}

async function readCapped(request: Request, maxBytes: number): Promise<string | null> {
	if (!request.body) return '';
	const reader = request.body.getReader();
	const chunks: Uint8Array[] = [];
	let size = 0;
	for (;;) {
		const { done, value } = await reader.read();
		if (done) break;
		size += value.byteLength;
		if (size > maxBytes) {
			await reader.cancel();
			return null;
		}
		chunks.push(value);
	}
	return new TextDecoder('utf-8', { fatal: false }).decode(Buffer.concat(chunks));
}
