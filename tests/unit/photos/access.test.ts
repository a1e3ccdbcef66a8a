import { describe, expect, it } from 'vitest';
import { checkTakesPhotos, mayUpload } from '../../../src/lib/photos/access.ts';
import { CHECK_STATES } from '../../../src/lib/check/vocabulary.ts';

describe('checkTakesPhotos', () => {
	it('takes photographs only while a check can still be edited', () => {
		const open = CHECK_STATES.filter((s) => checkTakesPhotos(s).ok);
		expect(open).toEqual(['draft', 'returned']);
	});

	it('says why a submitted or approved check takes none, and that a missing one does not exist', () => {
		expect(checkTakesPhotos('in-review')).toMatchObject({ ok: false, status: 409, reason: expect.stringMatching(/waiting for review/) });
		expect(checkTakesPhotos('approved')).toMatchObject({ ok: false, status: 409, reason: expect.stringMatching(/approved and cannot change/) });
		expect(checkTakesPhotos(null)).toMatchObject({ ok: false, status: 404 });
	});

	it('is the rule mayUpload applies to a conservator’s photo of a check', () => {
		for (const state of CHECK_STATES) {
			expect(mayUpload('conservator', { specimenExists: true, check: { state, specimenMatches: true } })).toEqual(checkTakesPhotos(state));
		}
	});
});
