import { describe, expect, it } from 'vitest';
import { tusPrecondition } from '../../../src/lib/server/photos/tusPreconditions.ts';
import { MAX_UPLOAD_BYTES } from '../../../src/lib/photos/limits.ts';

/** tus 1.0.0 (§Tus-Resumable, §PATCH, §Tus-Max-Size) where @tus/server 2.4 answers 400 instead. */
const req = (method: string, path: string, headers: Record<string, string>) => new Request(`http://127.0.0.1${path}`, { method, headers });
const ok = { 'tus-resumable': '1.0.0' };

describe('tusPrecondition', () => {
	it('must 412 with Tus-Version on a missing or unsupported protocol version, for every method but OPTIONS', () => {
		for (const method of ['POST', 'HEAD', 'PATCH', 'DELETE']) {
			for (const headers of [{}, { 'tus-resumable': '0.2.2' }, { 'tus-resumable': '1.0.0, 0.2.2' }] as Record<string, string>[]) {
				const res = tusPrecondition(req(method, '/api/uploads/ab', headers), '/api/uploads');
				expect(res?.status, `${method} ${JSON.stringify(headers)}`).toBe(412);
				expect(res?.headers.get('tus-version')).toBe('1.0.0');
			}
		}
		expect(tusPrecondition(req('OPTIONS', '/api/uploads', {}), '/api/uploads')).toBeNull();
	});

	it('must 413 on an Upload-Length over the limit however long, and leave malformed ones to tus (400)', () => {
		expect(tusPrecondition(req('POST', '/api/uploads/', { ...ok, 'upload-length': String(MAX_UPLOAD_BYTES + 1) }), '/api/uploads')?.status).toBe(413);
		expect(tusPrecondition(req('POST', '/api/uploads', { ...ok, 'upload-length': '9'.repeat(40) }), '/api/uploads')?.status).toBe(413);
		for (const l of [String(MAX_UPLOAD_BYTES), '-1', 'abc', '1e30']) expect(tusPrecondition(req('POST', '/api/uploads', { ...ok, 'upload-length': l }), '/api/uploads'), l).toBeNull();
	});

	it('must 404 a creation anywhere but at the creation address', () => {
		for (const p of ['/api/uploads/x', '/api/uploads/..%2Fx', '/api/uploads/ab/cd']) expect(tusPrecondition(req('POST', p, ok), '/api/uploads')?.status, p).toBe(404);
	});

	it('must 415 a PATCH whose body is not application/offset+octet-stream', () => {
		expect(tusPrecondition(req('PATCH', '/api/uploads/ab', { ...ok, 'content-type': 'application/json' }), '/api/uploads')?.status).toBe(415);
		expect(tusPrecondition(req('PATCH', '/api/uploads/ab', ok), '/api/uploads')?.status).toBe(415);
		expect(tusPrecondition(req('PATCH', '/api/uploads/ab', { ...ok, 'content-type': 'application/offset+octet-stream' }), '/api/uploads')).toBeNull();
	});
});
