import net from 'node:net';
import { beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, call, useTestDatabase } from '../helpers/server.ts';
import { signedInUser } from '../helpers/users.ts';
import { QueryTypes } from 'sequelize';
import { db } from '../../src/lib/server/db.ts';
import { MAX_JSON_BYTES } from '../../src/lib/server/http.ts';
import { MAX_UPLOAD_BYTES } from '../../src/lib/photos/limits.ts';

/**
 * TESTPLAN L4, huge and slow bodies (ASVS 5.0 5.2.1 size caps, 2.4.1 bounded work; Astro's Node
 * adapter sets no body cap of its own; tus 1.0.0 413 for a length over the maximum): a 50 MB JSON
 * body with and without a declared length, a tus upload declaring more than the maximum, and a
 * client that sends its headers a byte at a time. Pass: 413 at the cap without the server reading
 * the rest, the app still answering others meanwhile, and the slow socket closed by the server.
 */
const MB50 = 50 * 1024 * 1024;
let cookie = '';
let specimenUrl = '';

beforeAll(async () => {
	useTestDatabase();
	({ cookie } = await signedInUser('conservator', 'huge'));
	const [row] = await db().query<{ id: string }>(`SELECT id FROM specimens WHERE object_number = 'STC.1898.014'`, { type: QueryTypes.SELECT });
	specimenUrl = `/api/specimens/${row!.id}`;
});

/** A raw HTTP/1.1 request on a socket, for what fetch will not send; resolves with the status line and how long the server took. */
function raw(head: string, body: (s: net.Socket) => void): Promise<{ status: number; ms: number; closed: boolean }> {
	const u = new URL(baseUrl());
	return new Promise((resolve, reject) => {
		const t0 = Date.now();
		const s = net.connect(Number(u.port), u.hostname, () => {
			s.write(head);
			body(s);
		});
		let text = '';
		s.on('data', (d) => {
			text += d.toString('latin1');
		});
		s.on('error', () => {});
		s.on('close', () => resolve({ status: Number(/^HTTP\/1\.1 (\d{3})/.exec(text)?.[1] ?? 0), ms: Date.now() - t0, closed: true }));
		setTimeout(() => reject(new Error('the server neither answered nor closed within 100 s')), 100_000);
	});
}

describe('huge and slow bodies (TESTPLAN L4)', () => {
	it('refuses a 50 MB JSON body with 413 at the cap, declared or streamed, without reading it all', async () => {
		expect(MB50).toBeGreaterThan(MAX_JSON_BYTES);
		// Declared length: refused on the header alone.
		const big = Buffer.alloc(MB50, 0x20);
		const t0 = Date.now();
		const res = await fetch(baseUrl() + specimenUrl, { method: 'PUT', headers: { cookie, origin: baseUrl(), 'content-type': 'application/json' }, body: big });
		expect(res.status).toBe(413);
		expect((await res.json()).error).toMatch(/too large/);
		console.log(`[L4] 50 MB declared: 413 in ${Date.now() - t0} ms`);
		// No declared length (chunked): refused once the cap is passed; the socket is not read to the end.
		const chunked = await raw(
			`PUT ${specimenUrl} HTTP/1.1\r\nHost: ${new URL(baseUrl()).host}\r\nCookie: ${cookie}\r\nOrigin: ${baseUrl()}\r\nContent-Type: application/json\r\nTransfer-Encoding: chunked\r\nConnection: close\r\n\r\n`,
			(s) => {
				let sent = 0;
				const piece = Buffer.alloc(64 * 1024, 0x20);
				const pump = () => {
					while (sent < MB50 && !s.destroyed) {
						sent += piece.length;
						if (!s.write(`${piece.length.toString(16)}\r\n`) || !s.write(piece) || !s.write('\r\n')) return void s.once('drain', pump);
					}
					if (!s.destroyed) s.end('0\r\n\r\n');
				};
				pump();
			},
		);
		expect(chunked.status).toBe(413);
		console.log(`[L4] 50 MB chunked: ${chunked.status} in ${chunked.ms} ms`);
		expect((await call('/api/me', { cookie })).status).toBe(200);
	}, 120_000);

	it('refuses a tus upload declaring more than the maximum with 413', async () => {
		const res = await call('/api/uploads/', {
			cookie,
			method: 'POST',
			headers: {
				'tus-resumable': '1.0.0',
				'upload-length': String(MAX_UPLOAD_BYTES + 1),
				'upload-metadata': `filename ${Buffer.from('huge.jpg').toString('base64')},filetype ${Buffer.from('image/jpeg').toString('base64')}`,
			},
		});
		expect(res.status).toBe(413);
	});

	it('closes a connection whose headers arrive a byte at a time', async () => {
		// Node's http server ends a request whose headers take longer than headersTimeout (60 s).
		const head = `GET /api/me HTTP/1.1\r\nHost: ${new URL(baseUrl()).host}\r\nX-Slow: ${'a'.repeat(200)}\r\n`;
		const slow = await raw('', (s) => {
			let i = 0;
			const drip = setInterval(() => {
				if (s.destroyed || i >= head.length) return clearInterval(drip);
				s.write(head[i++]!);
			}, 400);
		});
		expect(slow.closed).toBe(true);
		expect(slow.ms).toBeLessThan(95_000);
		console.log(`[L4] slow headers: closed after ${slow.ms} ms with status ${slow.status || 'none'}`);
		expect((await call('/api/me', { cookie })).status).toBe(200);
	}, 120_000);
});
