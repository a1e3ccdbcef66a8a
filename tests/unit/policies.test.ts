import { describe, expect, it } from 'vitest';
import { passwordProblems, PASSWORD_MIN } from '../../src/lib/auth/passwordPolicy.ts';
import { ACCOUNT_RULE, ADDRESS_RULE, DEVICE_RULE, afterFailure, afterRefund, throttleKeys, waitMs, describeWait } from '../../src/lib/auth/throttlePolicy.ts';

describe('password policy (OWASP ASVS 5.0 6.2)', () => {
	it('asks for at least 12 characters, counted as characters, not bytes', () => {
		expect(PASSWORD_MIN).toBe(12);
		expect(passwordProblems('eleven char')).toContain('too-short');
		expect(passwordProblems('twelve chars')).toEqual([]);
		expect(passwordProblems('ééééééééééé')).toContain('too-short'); // 11 characters, 22 bytes
	});
	it('allows long passphrases and any characters, with no composition rules', () => {
		expect(passwordProblems('the quick brown fox jumps over the lazy jar '.repeat(5))).toEqual([]);
		expect(passwordProblems('日本語のパスワードです十二')).toEqual([]);
	});
	it('refuses over 256 characters, common passwords, repetition and the account’s own name', () => {
		expect(passwordProblems('a'.repeat(257))).toContain('too-long');
		expect(passwordProblems('password1234')).toContain('common');
		expect(passwordProblems('abcabcabcabcabc')).toContain('repetitive');
		expect(passwordProblems('marlowe-rules-ok', { email: 'marlowe@example.org' })).toContain('personal');
	});
});

describe('sign-in throttling (common practice, no published source)', () => {
	const t0 = new Date('2026-03-02T08:00:00Z');
	const at = (s: number) => new Date(t0.getTime() + s * 1000);

	it('lets five attempts fail freely, then makes the sixth wait 30 s, doubling each time, capped at 15 min', () => {
		let st = null;
		for (let i = 0; i < 4; i++) st = afterFailure(st, at(i), ACCOUNT_RULE);
		expect(waitMs(st, at(4))).toBe(0);
		st = afterFailure(st, at(4), ACCOUNT_RULE);
		expect(waitMs(st, at(4))).toBe(30_000);
		st = afterFailure(st, at(40), ACCOUNT_RULE);
		expect(waitMs(st, at(40))).toBe(60_000);
		for (let i = 0; i < 10; i++) st = afterFailure(st, at(100 + i), ACCOUNT_RULE);
		expect(waitMs(st, at(109))).toBe(15 * 60_000);
	});

	it('starts counting afresh once the window has passed', () => {
		let st = null;
		for (let i = 0; i < 6; i++) st = afterFailure(st, at(i), ACCOUNT_RULE);
		st = afterFailure(st, at(16 * 60), ACCOUNT_RULE);
		expect(st.failures).toBe(1);
		expect(waitMs(st, at(16 * 60))).toBe(0);
	});

	it('says the wait in whole minutes', () => {
		expect(describeWait(30_000)).toBe('a minute');
		expect(describeWait(14 * 60_000 + 1)).toBe('15 minutes');
	});
});

describe('which counters a sign-in attempt is charged to (OWASP, "Slow Down Online Guessing Attacks with Device Cookies")', () => {
	it('charges a browser without a device cookie to the account and the address', () => {
		expect(throttleKeys('a@example.org', '192.0.2.9', null)).toEqual([
			['account:a@example.org', ACCOUNT_RULE],
			['address:192.0.2.9', ADDRESS_RULE],
		]);
	});
	it('charges a trusted browser to its own counter only, so guesses elsewhere cannot lock it out', () => {
		expect(throttleKeys('a@example.org', '192.0.2.9', 'ab12')).toEqual([['device:ab12', DEVICE_RULE]]);
	});
});

describe('an attempt charged in advance and refunded on success', () => {
	const now = new Date('2026-03-02T08:00:00Z');
	it('takes the charge back and lifts a wait that charge alone caused', () => {
		let st = null;
		for (let i = 0; i < ADDRESS_RULE.free; i++) st = afterFailure(st, now, ADDRESS_RULE);
		expect(waitMs(st, now)).toBeGreaterThan(0);
		const back = afterRefund(st!, ADDRESS_RULE);
		expect(back.failures).toBe(ADDRESS_RULE.free - 1);
		expect(waitMs(back, now)).toBe(0);
	});
	it('keeps a wait that earlier failures had earned', () => {
		let st = null;
		for (let i = 0; i < ADDRESS_RULE.free + 2; i++) st = afterFailure(st, now, ADDRESS_RULE);
		expect(waitMs(afterRefund(st!, ADDRESS_RULE), now)).toBeGreaterThan(0);
	});
});

