import { describe, expect, it } from 'vitest';
import { isOutOfSpace } from '../../../src/lib/server/photos/diskFull.ts';
import { DerivativeWriteError, isDecodeError } from '../../../src/lib/server/photos/pipeline.ts';

/**
 * TESTPLAN F7 (ASVS 5.0 16.5.3): a full disk is the machine's fault, never the photo's. The libvips
 * messages are the ones sharp 0.34.5 gave on a full tmpfs here (JPEG, tile pyramid, PNG); before the
 * fix the JPEG one counted as "cannot be decoded", so the upload was refused and its bytes removed.
 */
const enospc = Object.assign(new Error('ENOSPC: no space left on device, write'), { code: 'ENOSPC' });
const vipsJpeg = new Error('/u/work/2bb3/thumbnail.jpg: write error\nsystem error: No space left on device\nVipsJpeg: unable to write to target');
const vipsTiles = new Error('vips__file_write: write error (0 out of 37626 blocks written)\nsystem error: No space left on device\nwbuffer_write: write failed');
const vipsPng = new Error('/u/a.png: write error\nsystem error: No space left on device\npngsave: stream error');

describe('a full disk', () => {
	it('is recognised from the errno and from the words libvips uses', () => {
		for (const err of [enospc, Object.assign(new Error('quota'), { code: 'EDQUOT' }), vipsJpeg, vipsTiles, vipsPng]) expect(isOutOfSpace(err)).toBe(true);
		expect(isOutOfSpace(new Error('VipsJpeg: Premature end of input file'))).toBe(false);
		expect(isOutOfSpace(Object.assign(new Error('EACCES'), { code: 'EACCES' }))).toBe(false);
	});

	it('never makes a photo undecodable, while a damaged file still is', () => {
		for (const err of [vipsJpeg, vipsTiles, vipsPng, enospc]) expect(isDecodeError(err)).toBe(false);
		expect(isDecodeError(new Error('VipsJpeg: Premature end of input file'))).toBe(true);
	});

	it('is not a decode error when writing a derivative fails for any reason, and says what happened', () => {
		const err = new DerivativeWriteError(vipsJpeg);
		expect(isDecodeError(err)).toBe(false);
		expect(err.message).toMatch(/^Out of disk space while writing the derivatives \(.*No space left on device/);
		expect(isDecodeError(new DerivativeWriteError(new Error('VipsJpeg: unable to write to target')))).toBe(false);
	});
});
