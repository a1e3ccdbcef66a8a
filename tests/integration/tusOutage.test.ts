import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freePort } from '../../db/cluster.mjs';
import { UNAVAILABLE_MESSAGE } from '../../src/lib/server/dbErrors.ts';

/**
 * The tus server with its database away (TESTPLAN F6 for uploads, F4's locker): the module itself,
 * in this test process, pointed at a port nothing listens on, so a request gets past the session
 * check (done by the middleware, which the route would have answered 503 itself) and meets the
 * outage in tus's own hooks. Pass: 503 with Retry-After and the message that nothing was changed
 * (ASVS 5.0 16.5.2, degrade gracefully), never tus's 500; no bytes kept.
 */
let tmp = '';
let handleTus: typeof import('../../src/lib/server/photos/tus.ts').handleTus;
const user = { id: crypto.randomUUID(), email: 'outage@example.org', name: 'Test conservator', role: 'conservator' as const };
const site = 'http://127.0.0.1:4321';

const saved = { ...process.env };

beforeAll(async () => {
	tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'meniscus-tus-outage-'));
	process.env.DATABASE_URL = `postgres://nobody@127.0.0.1:${await freePort()}/none`;
	process.env.MENISCUS_PUBLIC_URL = site;
	process.env.MENISCUS_UPLOADS_DIR = tmp;
	({ handleTus } = await import('../../src/lib/server/photos/tus.ts'));
	(await import('../../src/lib/server/db.ts')).db();
});

afterAll(() => {
	process.env = saved;
	if (tmp) fs.rmSync(tmp, { recursive: true, force: true });
});

describe('tus requests while the database cannot be reached', () => {
	it.each([
		['HEAD', {}],
		['PATCH', { 'upload-offset': '0', 'content-type': 'application/offset+octet-stream' }],
	] as const)('answer %s with 503, Retry-After and nothing written', async (method, headers) => {
		const id = crypto.randomBytes(16).toString('hex');
		const body = method === 'PATCH' ? Buffer.alloc(1024, 7) : undefined;
		const res = await handleTus(new Request(`${site}/api/uploads/${id}`, { method, headers: { 'tus-resumable': '1.0.0', origin: site, ...headers }, body }), user);
		expect(res.status).toBe(503);
		expect(res.headers.get('retry-after')).toBe('5');
		if (method === 'PATCH') expect(await res.text()).toBe(`${UNAVAILABLE_MESSAGE}\n`);
		expect(fs.readdirSync(path.join(tmp, 'incoming')).filter((f) => f.startsWith(id))).toEqual([]);
	});
});
