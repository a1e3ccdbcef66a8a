/**
 * The islands' way to call the API: JSON in and out, same-origin cookies, and errors turned into
 * an ApiError that carries the server's message and per-field problems for the form to show.
 */
export class ApiError extends Error {
	constructor(
		readonly status: number,
		message: string,
		readonly fields: { path: string; message: string }[] = [],
		/** The whole answer, for routes that send more than a message (e.g. the record now, on 409). */
		readonly body: unknown = null,
	) {
		super(message);
	}
}

export async function api<T>(url: string, init: { method?: string; body?: unknown } = {}): Promise<T> {
	const res = await fetch(url, {
		method: init.method ?? 'GET',
		credentials: 'same-origin',
		headers: init.body === undefined ? { accept: 'application/json' } : { accept: 'application/json', 'content-type': 'application/json' },
		body: init.body === undefined ? undefined : JSON.stringify(init.body),
	});
	if (res.status === 401) {
		// The session ended (idle or signed out elsewhere): go to sign-in and come back here.
		window.location.assign(`/login?next=${encodeURIComponent(location.pathname + location.search)}&why=expired`);
		throw new ApiError(401, 'Signed out');
	}
	const data = (await res.json().catch(() => null)) as { error?: string; fields?: ApiError['fields'] } | null;
	if (!res.ok) throw new ApiError(res.status, data?.error ?? `The server answered ${res.status}.`, data?.fields ?? [], data);
	return data as T;
}
