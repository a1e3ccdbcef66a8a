/**
 * Sign-in throttling (OWASP ASVS 5.0 6.3.1: brute-force controls without a lockout that an attacker
 * could use to shut a real user out). Failures are counted per account and per client address in a
 * window; once the allowance is used up each further failure doubles the wait, capped, so a real
 * user waits minutes at worst and never needs an administrator to unlock.
 * The numbers are common practice, no published source.
 */
export interface ThrottleRule {
	/** Failures in the window after which the next attempt must wait. */
	free: number;
	/** Window after the first failure in which failures are counted, ms. */
	windowMs: number;
	/** Wait after the first failure past the allowance, ms; doubles each further failure. */
	baseDelayMs: number;
	/** Longest wait, ms. */
	maxDelayMs: number;
}

export const ACCOUNT_RULE: ThrottleRule = {
	free: 5,
	windowMs: 15 * 60_000,
	baseDelayMs: 30_000,
	maxDelayMs: 15 * 60_000,
};

/** Per address: looser, since a store room may share one address among several people. */
export const ADDRESS_RULE: ThrottleRule = {
	free: 30,
	windowMs: 15 * 60_000,
	baseDelayMs: 60_000,
	maxDelayMs: 15 * 60_000,
};

/**
 * Per trusted browser (a valid device cookie for the account being signed in to): such an attempt is
 * counted on its own token only, not on the account or the address, so failures elsewhere never lock
 * the real user out (OWASP, "Slow Down Online Guessing Attacks with Device Cookies"). A stolen
 * cookie still gets only this allowance. Numbers: common practice, no published source.
 */
export const DEVICE_RULE: ThrottleRule = {
	free: 10,
	windowMs: 15 * 60_000,
	baseDelayMs: 60_000,
	maxDelayMs: 60 * 60_000,
};

/** How long a device cookie stays valid after the sign-in that issued it (common practice). */
export const DEVICE_DAYS = 180;
/** Devices remembered per account; older ones are forgotten first. */
export const DEVICES_PER_USER = 20;

/**
 * The counters an attempt is checked against and charged to: a trusted browser's own, or else the
 * account's and the address's (shared by every untrusted attempt on them).
 */
export function throttleKeys(email: string, clientAddress: string, trustedDevice: string | null): [string, ThrottleRule][] {
	if (trustedDevice) return [[`device:${trustedDevice}`, DEVICE_RULE]];
	return [
		[`account:${email}`, ACCOUNT_RULE],
		[`address:${clientAddress}`, ADDRESS_RULE],
	];
}

export interface ThrottleState {
	failures: number;
	windowStart: Date;
	blockedUntil: Date | null;
}

/** The state after one more failure at `now`. */
export function afterFailure(prev: ThrottleState | null, now: Date, rule: ThrottleRule): ThrottleState {
	const fresh = !prev || now.getTime() - prev.windowStart.getTime() > rule.windowMs;
	const failures = fresh ? 1 : prev.failures + 1;
	const windowStart = fresh ? now : prev.windowStart;
	const over = failures - rule.free; // 0 at the failure that uses up the allowance
	const blockedUntil =
		over >= 0 ? new Date(now.getTime() + Math.min(rule.maxDelayMs, rule.baseDelayMs * 2 ** over)) : null;
	return { failures, windowStart, blockedUntil };
}

/**
 * The state once an attempt charged in advance turned out to be a success: that charge is taken
 * back, and a wait it alone caused is lifted.
 */
export function afterRefund(state: ThrottleState, rule: ThrottleRule): ThrottleState {
	const failures = Math.max(0, state.failures - 1);
	return { ...state, failures, blockedUntil: failures - rule.free >= 0 ? state.blockedUntil : null };
}

/** Milliseconds still to wait at `now`, 0 when a sign-in attempt may go ahead. */
export function waitMs(state: ThrottleState | null, now: Date): number {
	if (!state?.blockedUntil) return 0;
	return Math.max(0, state.blockedUntil.getTime() - now.getTime());
}

/** A wait in words for the sign-in page ("about 2 minutes"). */
export function describeWait(ms: number): string {
	const minutes = Math.ceil(ms / 60_000);
	return minutes <= 1 ? 'a minute' : `${minutes} minutes`;
}
