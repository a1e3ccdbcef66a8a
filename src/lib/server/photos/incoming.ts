import fsp from 'node:fs/promises';
import path from 'node:path';
import { z } from 'zod';
import { dirs, SAFE_ID } from './storage.ts';

/**
 * What tus's FileStore keeps about an upload in incoming/: the bytes in `<id>` and, beside them,
 * `<id>.json` with the declared size and the metadata (including what onUploadCreate added, such
 * as who uploaded it). Read here by the worker and the reconciler, never written.
 */
const TusInfo = z.object({
	id: z.string().regex(SAFE_ID),
	size: z.number().int().nonnegative().optional(),
	metadata: z.record(z.string(), z.string().nullable()).optional(),
	creation_date: z.string().optional(),
});
export type TusInfo = z.infer<typeof TusInfo>;

export const incomingFile = (id: string) => {
	if (!SAFE_ID.test(id)) throw new Error(`not an upload id: ${JSON.stringify(id).slice(0, 80)}`);
	return path.join(dirs.incoming(), id);
};

export async function readTusInfo(id: string): Promise<TusInfo | null> {
	try {
		const parsed = TusInfo.safeParse(JSON.parse(await fsp.readFile(`${incomingFile(id)}.json`, 'utf8')));
		return parsed.success ? parsed.data : null;
	} catch {
		return null;
	}
}

/** Bytes received so far, or null when there is no file. */
export async function receivedBytes(id: string): Promise<number | null> {
	try {
		return (await fsp.stat(incomingFile(id))).size;
	} catch {
		return null;
	}
}

/** Ids of every upload in incoming/ that has both its bytes and its info file. */
export async function listIncoming(): Promise<string[]> {
	let names: string[];
	try {
		names = await fsp.readdir(dirs.incoming());
	} catch {
		return [];
	}
	const set = new Set(names);
	return names.filter((n) => SAFE_ID.test(n) && set.has(`${n}.json`));
}

export async function removeIncoming(id: string): Promise<void> {
	const f = incomingFile(id);
	await fsp.rm(f, { force: true });
	await fsp.rm(`${f}.json`, { force: true });
}
