import fs from 'node:fs';
import path from 'node:path';
import * as tus from 'tus-js-client';
import { demoPassword } from '../../db/seeders/demoPassword.mjs';

/**
 * Talking to the running app from a benchmark, as a browser would: the session cookie from a form
 * sign-in (with its Origin, which the app checks) and tus uploads by tus-js-client, as
 * tests/helpers/photos.ts sends them. Shared by the benchmarks that start the built app.
 */

export function sessionCookie(res: Response): string | null {
	for (const c of res.headers.getSetCookie()) {
		const [pair] = c.split(';');
		if (pair && /session=/.test(pair) && !/=$/.test(pair)) return pair;
	}
	return null;
}

/** Signs in as a demo user (the demo conservator unless told) and returns the session cookie. */
export async function signIn(baseUrl: string, email = 'conservator@example.org'): Promise<string> {
	const login = await fetch(`${baseUrl}/login`, {
		method: 'POST',
		redirect: 'manual',
		headers: { origin: baseUrl, 'content-type': 'application/x-www-form-urlencoded' },
		body: new URLSearchParams({ email, password: demoPassword() }).toString(),
	});
	const cookie = sessionCookie(login);
	if (login.status !== 303 || !cookie) throw new Error(`sign-in failed: ${login.status}`);
	return cookie;
}

/** tus-js-client from Node, as tests/helpers/photos.ts calls it; resolves with the upload id. */
export function tusUpload(
	file: string,
	o: { endpoint: string; origin: string; cookie: string; specimenId: string; chunkSize: number; checkId?: string; onChunk?: () => void },
): Promise<string> {
	return new Promise((resolve, reject) => {
		const upload: tus.Upload = new tus.Upload(fs.createReadStream(file), {
			endpoint: o.endpoint,
			uploadSize: fs.statSync(file).size,
			chunkSize: o.chunkSize,
			retryDelays: [],
			metadata: { filename: path.basename(file), filetype: 'image/jpeg', specimenId: o.specimenId, view: 'front', stage: 'as-found', ...(o.checkId ? { checkId: o.checkId } : {}) },
			headers: { cookie: o.cookie, origin: o.origin },
			storeFingerprintForResuming: false,
			onChunkComplete: () => o.onChunk?.(),
			onError: (err) => reject(err),
			onSuccess: () => resolve(new URL(upload.url!, o.endpoint).pathname.split('/').pop()!),
		});
		upload.start();
	});
}
