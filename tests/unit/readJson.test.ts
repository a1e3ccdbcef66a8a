import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { holdsUnstorableText, readJson } from '../../src/lib/server/http.ts';

/**
 * TESTPLAN B5 (ASVS 5.0 2.2.1): a JSON body is refused with a 400 before the schema when a string or
 * a key holds U+0000 or a lone surrogate, which PostgreSQL cannot store (jsonFuzz.test.ts found the 500s).
 */
const post = (body: string) => new Request('http://127.0.0.1/api/x', { method: 'POST', headers: { 'content-type': 'application/json' }, body });
const Schema = z.object({ note: z.unknown() }).strict();

describe('readJson', () => {
	it('must 400 on a NUL in a string or a key, however deep, and say why', async () => {
		for (const body of ['{"note":"a\\u0000b"}', '{"note":[[{"x":"\\u0000"}]]}', '{"note":{"a\\u0000":1}}', '{"note":"a\\ud800b"}', '{"note":"\\udc00"}', '{"note":"\\ud800"}']) {
			const r = await readJson(post(body), Schema);
			expect(r.ok, body).toBe(false);
			if (!r.ok) {
				expect(r.response.status).toBe(400);
				expect((await r.response.json()).error).toMatch(/NUL|surrogate/);
			}
		}
	});

	it('takes the same text without them, a whole surrogate pair, and a backslash-u written out as text', async () => {
		expect(await readJson(post('{"note":"ab"}'), Schema)).toMatchObject({ ok: true, value: { note: 'ab' } });
		expect(await readJson(post('{"note":"\\ud83e\\udd90 squid"}'), Schema)).toMatchObject({ ok: true, value: { note: '🦐 squid' } });
		expect(await readJson(post('{"note":"\\\\u0000"}'), Schema)).toMatchObject({ ok: true, value: { note: '\\u0000' } });
	});
});

describe('holdsUnstorableText', () => {
	it('walks a body nested far deeper than the call stack, and a long array, without throwing', () => {
		const deep = JSON.parse('['.repeat(100_000) + '"\\u0000"' + ']'.repeat(100_000));
		expect(holdsUnstorableText(deep)).toBe(true);
		expect(holdsUnstorableText(new Array(200_000).fill('x'))).toBe(false);
	});
});
