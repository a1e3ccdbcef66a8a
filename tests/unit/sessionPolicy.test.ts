import { describe, expect, it } from 'vitest';
import { DEFAULT_SESSION_POLICY as P, nextExpiry, sessionVerdict, shouldTouch } from '../../src/lib/auth/sessionPolicy.ts';

/**
 * OWASP ASVS 4.0.3 §3.3.2 (level 2): re-authenticate after 30 minutes idle and at most 12 hours
 * after sign-in. A fake clock walks through both limits.
 */
const t0 = new Date('2026-03-02T08:00:00Z');
const at = (minutes: number) => new Date(t0.getTime() + minutes * 60_000);

describe('session expiry', () => {
	it('uses 30 minutes idle and 12 hours absolute by default', () => {
		expect(P.idleMs).toBe(30 * 60_000);
		expect(P.absoluteMs).toBe(12 * 3_600_000);
	});

	it('ends a session after 30 minutes without activity, not before', () => {
		const s = { createdAt: t0, expiresAt: nextExpiry(t0, t0, P) };
		expect(sessionVerdict(s, at(29), P)).toBe('valid');
		expect(sessionVerdict(s, at(30), P)).toBe('idle-expired');
		expect(sessionVerdict(s, at(31), P)).toBe('idle-expired');
	});

	it('moves the idle deadline with activity', () => {
		let s = { createdAt: t0, expiresAt: nextExpiry(t0, t0, P) };
		s = { ...s, expiresAt: nextExpiry(t0, at(25), P) };
		expect(sessionVerdict(s, at(50), P)).toBe('valid');
		expect(sessionVerdict(s, at(56), P)).toBe('idle-expired');
	});

	it('ends even a busy session 12 hours after sign-in', () => {
		let s = { createdAt: t0, expiresAt: nextExpiry(t0, t0, P) };
		for (let m = 10; m < 12 * 60; m += 10) {
			expect(sessionVerdict(s, at(m), P)).toBe('valid');
			s = { ...s, expiresAt: nextExpiry(t0, at(m), P) };
		}
		expect(sessionVerdict(s, at(12 * 60), P)).toBe('absolute-expired');
		// The idle deadline never runs past the absolute limit.
		expect(nextExpiry(t0, at(12 * 60 - 5), P).getTime()).toBe(at(12 * 60).getTime());
	});

	it('writes the new deadline at most once a minute', () => {
		const s = { createdAt: t0, expiresAt: nextExpiry(t0, at(10), P) };
		expect(shouldTouch(s, at(10.5), P)).toBe(false);
		expect(shouldTouch(s, at(11), P)).toBe(true);
	});
});
