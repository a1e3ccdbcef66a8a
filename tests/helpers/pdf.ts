import { extractText, getDocumentProxy } from 'unpdf';
import { call } from './server.ts';

/** A check's PDF condition report, fetched as `cookie`, with its text read back page by page (unpdf). */
export async function reportOf(id: string, cookie: string): Promise<{ res: Response; bytes: Uint8Array; pages: string[]; ms: number }> {
	const t0 = performance.now();
	const res = await call(`/api/checks/${id}/report.pdf`, { cookie });
	const bytes = new Uint8Array(await res.arrayBuffer());
	const ms = performance.now() - t0;
	if (res.status !== 200) return { res, bytes, pages: [], ms };
	const { text } = await extractText(await getDocumentProxy(bytes.slice()), { mergePages: false });
	return { res, bytes, pages: text as string[], ms };
}
