import type { Mark } from '../../lib/marks/schema.ts';
import type { Region } from '../../lib/marks/snapshot.ts';
import { drawSnapshot } from './drawMarks.ts';

/**
 * Draws mark bitmaps for moving views off the main thread, so a pan or zoom never waits for a
 * thousand marks to be stroked (bench/canvas.ts): the page keeps showing the bitmap it has, scaled,
 * until this one arrives. The layer is sent when it changes; each request names the layer's
 * generation, so a bitmap of marks since changed is never returned as current.
 */
export type ToWorker = { type: 'marks'; generation: number; marks: readonly Mark[] } | { type: 'draw'; id: number; generation: number; region: Region; dpr: number };
export type FromWorker = { id: number; generation: number; region: Region; bitmap: ImageBitmap } | { id: number; error: string };

const scope = self as unknown as { onmessage: ((e: MessageEvent<ToWorker>) => void) | null; postMessage(m: FromWorker, transfer?: Transferable[]): void };
let marks: readonly Mark[] = [];
// The page starts at generation 0 with no marks, and sends marks only when they change.
let generation = 0;

scope.onmessage = (e) => {
	const m = e.data;
	if (m.type === 'marks') {
		marks = m.marks;
		generation = m.generation;
		return;
	}
	if (m.generation !== generation) {
		scope.postMessage({ id: m.id, error: 'stale' });
		return;
	}
	try {
		const bitmap = drawSnapshot(marks, m.region, m.dpr);
		if (!(bitmap instanceof ImageBitmap)) throw new Error('OffscreenCanvas is not available in this worker');
		scope.postMessage({ id: m.id, generation, region: m.region, bitmap }, [bitmap]);
	} catch (err) {
		scope.postMessage({ id: m.id, error: err instanceof Error ? err.message : String(err) });
	}
};
