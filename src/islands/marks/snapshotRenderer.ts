import type { Mark } from '../../lib/marks/schema.ts';
import { sameMarks, sameRegion, type Region } from '../../lib/marks/snapshot.ts';
import { drawSnapshot } from './drawMarks.ts';
import type { FromWorker, ToWorker } from './snapshot.worker.ts';

export interface Snapshot {
	image: ImageBitmap | HTMLCanvasElement;
	region: Region;
}

/**
 * Keeps the newest bitmap of the current marks and asks for the next one: from the worker when the
 * browser can run it (one request in flight, the latest wish queued behind it), otherwise drawn
 * here on the main thread, which is slower but looks the same.
 */
export class SnapshotRenderer {
	private worker: Worker | null = null;
	private marks: readonly Mark[] = [];
	private generation = 0;
	private latest: (Snapshot & { generation: number }) | null = null;
	private inFlight: { id: number; region: Region } | null = null;
	private queued: { region: Region; dpr: number } | null = null;
	private nextId = 1;

	constructor(private readonly onReady: () => void) {
		try {
			if (typeof Worker === 'function' && typeof OffscreenCanvas === 'function') {
				this.worker = new Worker(new URL('./snapshot.worker.ts', import.meta.url), { type: 'module' });
				this.worker.onmessage = (e: MessageEvent<FromWorker>) => this.received(e.data);
				// A worker the page may not start (a policy, an old browser) leaves the main-thread path.
				this.worker.onerror = () => this.fallBack();
			}
		} catch {
			this.worker = null;
		}
	}

	setMarks(marks: readonly Mark[]) {
		if (sameMarks(this.marks, marks)) return;
		this.marks = marks;
		this.generation++;
		this.worker?.postMessage({ type: 'marks', generation: this.generation, marks } satisfies ToWorker);
	}

	/** The newest bitmap of the marks as they are now, or null. */
	current(): Snapshot | null {
		return this.latest && this.latest.generation === this.generation ? this.latest : null;
	}

	request(region: Region, dpr: number) {
		const have = this.current();
		if (have && sameRegion(have.region, region)) return;
		if (!this.worker) {
			this.store({ image: drawSnapshot(this.marks, region, dpr), region }, this.generation);
			return;
		}
		if (this.inFlight) {
			if (!sameRegion(this.inFlight.region, region)) this.queued = { region, dpr };
			return;
		}
		const id = this.nextId++;
		this.inFlight = { id, region };
		this.worker.postMessage({ type: 'draw', id, generation: this.generation, region, dpr } satisfies ToWorker);
	}

	dispose() {
		this.worker?.terminate();
		this.worker = null;
		this.release();
	}

	private received(m: FromWorker) {
		if (this.inFlight?.id === m.id) this.inFlight = null;
		if ('bitmap' in m) {
			if (m.generation === this.generation) {
				this.store({ image: m.bitmap, region: m.region }, m.generation);
				this.onReady();
			} else m.bitmap.close();
		} else if (m.error !== 'stale') this.fallBack();
		const q = this.queued;
		this.queued = null;
		if (q) this.request(q.region, q.dpr);
	}

	private store(s: Snapshot, generation: number) {
		this.release();
		this.latest = { ...s, generation };
	}

	private release() {
		if (this.latest?.image instanceof ImageBitmap) this.latest.image.close();
		this.latest = null;
	}

	private fallBack() {
		this.worker?.terminate();
		this.worker = null;
		this.inFlight = null;
	}
}
