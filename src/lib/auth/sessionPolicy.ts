/**
 * When a session ends. OWASP ASVS 4.0.3 §3.3.2 (level 2) asks for re-authentication after at most
 * 12 hours and after 30 minutes of inactivity; ASVS 5.0 7.3.1/7.3.2 keep the two limits. Both are
 * configurable; these functions are pure so the rules can be tested with a fake clock.
 */
export interface SessionPolicy {
	/** Inactivity that ends a session, in ms. */
	idleMs: number;
	/** Lifetime of a session however active, in ms. */
	absoluteMs: number;
	/** Write the new idle deadline at most this often, so every request is not a database write. */
	touchEveryMs: number;
}

export const DEFAULT_SESSION_POLICY: SessionPolicy = {
	idleMs: 30 * 60_000,
	absoluteMs: 12 * 60 * 60_000,
	touchEveryMs: 60_000,
};

export type SessionVerdict = 'valid' | 'idle-expired' | 'absolute-expired';

export interface SessionTimes {
	createdAt: Date;
	/** The idle deadline stored with the session. */
	expiresAt: Date;
}

export function sessionVerdict(s: SessionTimes, now: Date, policy: SessionPolicy): SessionVerdict {
	if (now.getTime() >= s.createdAt.getTime() + policy.absoluteMs) return 'absolute-expired';
	if (now.getTime() >= s.expiresAt.getTime()) return 'idle-expired';
	return 'valid';
}

/** The idle deadline after activity at `now`, never past the absolute limit. */
export function nextExpiry(createdAt: Date, now: Date, policy: SessionPolicy): Date {
	return new Date(Math.min(now.getTime() + policy.idleMs, createdAt.getTime() + policy.absoluteMs));
}

/** Whether activity at `now` should move the stored deadline (it lags by at most touchEveryMs). */
export function shouldTouch(s: SessionTimes, now: Date, policy: SessionPolicy): boolean {
	return nextExpiry(s.createdAt, now, policy).getTime() - s.expiresAt.getTime() >= policy.touchEveryMs;
}
