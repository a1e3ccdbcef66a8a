import { expect } from 'vitest';
import { call } from './server.ts';
import { specimenRecord } from './specimens.ts';

/**
 * People saving specimen records over and over, each naming the version it read, for the fault
 * tests: an answer lost to a fault (no answer, or a 503) is retried with the same version and value,
 * and a 409 whose current record is exactly that value means the lost save had committed whole.
 * Anything else is a failure of the test. At the end, what each saver believes was acknowledged is
 * compared with the database.
 */
export type SaveTarget = { id: string; record: Record<string, unknown>; first: number; version: number; title: string };

export async function saveTargets(cookie: string, prefix: string, n: number, base?: string): Promise<SaveTarget[]> {
	const out: SaveTarget[] = [];
	for (let i = 0; i < n; i++) {
		const record = specimenRecord(prefix);
		const res = await call('/api/specimens', { cookie, json: record, ...(base ? { base } : {}) });
		expect(res.status).toBe(201);
		const { specimen } = await res.json();
		out.push({ id: specimen.id, record, first: specimen.version, version: specimen.version, title: record.title });
	}
	return out;
}

export function startSavers(o: { cookie: string; targets: SaveTarget[]; base?: string; retry: readonly number[] }) {
	const statuses = new Map<number, number>();
	const refusals: string[] = [];
	let running = true;
	let n = 0;
	const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
	const loop = async (t: SaveTarget) => {
		let pending: string | null = null;
		while (running) {
			const title: string = pending ?? `Fault newt ${++n}`;
			const res: Response | null = await call(`/api/specimens/${t.id}`, { cookie: o.cookie, method: 'PUT', json: { version: t.version, record: { ...t.record, title } }, ...(o.base ? { base: o.base } : {}) }).catch(() => null);
			const status = res?.status ?? 0;
			statuses.set(status, (statuses.get(status) ?? 0) + 1);
			const body = (res ? await res.json().catch(() => null) : null) as { specimen?: { version: number }; current?: { version: number; title: string }; error?: string } | null;
			if (status === 200 && body?.specimen) {
				[t.version, t.title, pending] = [body.specimen.version, title, null];
			} else if (o.retry.includes(status)) {
				if (status !== 0) refusals.push(body?.error ?? '');
				pending = title; // The same save again, naming the same version.
				await sleep(200);
			} else if (status === 409 && pending !== null && body?.current?.version === t.version + 1 && body.current.title === pending) {
				[t.version, t.title, pending] = [body.current.version, pending, null];
			} else {
				throw new Error(`unexpected answer ${status}: ${JSON.stringify(body)}`);
			}
		}
	};
	const loops = o.targets.map(loop);
	return {
		statuses,
		refusals,
		async stop() {
			running = false;
			await Promise.all(loops);
		},
	};
}

/** Every saver's last acknowledged save is what the database holds. */
export async function expectAcknowledgedKept(cookie: string, targets: SaveTarget[]): Promise<void> {
	for (const t of targets) {
		const { specimen } = await (await call(`/api/specimens/${t.id}`, { cookie })).json();
		expect([specimen.version, specimen.title]).toEqual([t.version, t.title]);
	}
}
