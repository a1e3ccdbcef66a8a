import { describe, expect, it } from 'vitest';
import { DEFAULT_INTERVAL_MONTHS, nextCheckDue, overallGrade, suggestedPriority, worstGrade } from '../../../src/lib/check/grading.ts';

describe('overall condition', () => {
	it('is the most serious part grade (documentation practice: Collections Trust, Spectrum "Condition" unit, TRADE.md [S44c])', () => {
		expect(worstGrade(['good', 'fair', null, 'poor', 'good'])).toBe('poor');
		expect(worstGrade(['good', 'unacceptable', 'fair'])).toBe('unacceptable');
		expect(worstGrade([null, undefined])).toBeNull();
	});
	it('can differ from the worst part only with a written reason', () => {
		expect(overallGrade(['poor', 'good'], { grade: 'fair', reason: 'too short' })).toMatchObject({ grade: 'poor', problem: expect.stringMatching(/say why/) });
		expect(overallGrade(['poor', 'good'], { grade: 'fair', reason: 'The poor label is a copy; the original is in the archive.' })).toEqual({ grade: 'fair', overridden: true, problem: null });
		expect(overallGrade(['poor'], { grade: 'poor', reason: '' })).toEqual({ grade: 'poor', overridden: false, problem: null });
	});
});

describe('next check due', () => {
	it('uses the interval of the grade; poor is the six-month general guideline (TRADE.md [S1])', () => {
		expect(DEFAULT_INTERVAL_MONTHS.poor).toBe(6);
		expect(nextCheckDue('2026-03-15', 'poor')).toBe('2026-09-15');
		expect(nextCheckDue('2026-03-15', 'good')).toBe('2028-03-15');
		expect(nextCheckDue('2026-12-20', 'unacceptable')).toBe('2027-01-20');
	});
	it('keeps the end of a short month honest: 31 August + 6 months is 28 February (29 in a leap year)', () => {
		expect(nextCheckDue('2026-08-31', 'poor')).toBe('2027-02-28');
		expect(nextCheckDue('2027-08-31', 'poor')).toBe('2028-02-29');
	});
	it('follows intervals the administrator set, and refuses a bad date', () => {
		expect(nextCheckDue('2026-01-10', 'fair', { good: 36, fair: 18, poor: 6, unacceptable: 1 })).toBe('2027-07-10');
		expect(() => nextCheckDue('10/01/2026', 'fair')).toThrow(RangeError);
	});
});

describe('suggested priority (common practice, no published source)', () => {
	it('rises with the grade, and one step for a toxic or unknown hazard on a poor jar', () => {
		expect(suggestedPriority('good', false)).toBe('none');
		expect(suggestedPriority('fair', true)).toBe('routine');
		expect(suggestedPriority('poor', false)).toBe('high');
		expect(suggestedPriority('poor', true)).toBe('urgent');
		expect(suggestedPriority(null, true)).toBe('none');
	});
});
