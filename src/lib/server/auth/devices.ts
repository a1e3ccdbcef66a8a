import { randomBytes } from 'node:crypto';
import { Op } from 'sequelize';
import type { AstroCookies } from 'astro';
import { SignInDevice } from '../models/index.ts';
import { config } from '../config.ts';
import { sha256 as hash } from './tokens.ts';
import { DEVICE_DAYS, DEVICES_PER_USER } from '../../auth/throttlePolicy.ts';

/**
 * Device cookies (OWASP, "Slow Down Online Guessing Attacks with Device Cookies"): after a successful
 * sign-in the browser gets a random 256-bit token; the server keeps only its SHA-256, with the account
 * and an expiry. A later sign-in to the same account from that browser is throttled on the token alone
 * (throttlePolicy.ts), so a password-guessing flood from elsewhere does not lock the real user out.
 * The token grants nothing by itself: the password is still needed.
 */
const TOKEN = /^[A-Za-z0-9_-]{43}$/;

export function deviceCookieName(): string {
	// __Host- needs Secure; over plain http on loopback (development, tests) the plain name is used.
	return config().secureCookies ? '__Host-meniscus_device' : 'meniscus_device';
}

/**
 * The throttle id of the browser's device token when it is valid for this account, else null. The id
 * is a prefix of the token's hash, never the token, so the throttle table holds nothing replayable.
 */
export async function trustedDevice(token: string | undefined, userId: string | null, now = new Date()): Promise<string | null> {
	if (!token || !userId || !TOKEN.test(token)) return null;
	const row = await SignInDevice.findByPk(hash(token));
	if (!row || row.userId !== userId || row.expiresAt <= now) return null;
	return row.tokenHash.slice(0, 32);
}

/**
 * Remembers this browser after a successful sign-in: a fresh token every time (the one it brought is
 * replaced), and only the newest DEVICES_PER_USER kept per account.
 */
export async function rememberDevice(userId: string, previous: string | undefined, now = new Date()): Promise<string> {
	const token = randomBytes(32).toString('base64url');
	if (previous && TOKEN.test(previous)) await SignInDevice.destroy({ where: { tokenHash: hash(previous), userId } });
	await SignInDevice.create({ tokenHash: hash(token), userId, expiresAt: new Date(now.getTime() + DEVICE_DAYS * 86_400_000) });
	const keep = await SignInDevice.findAll({ where: { userId }, order: [['createdAt', 'DESC']], limit: DEVICES_PER_USER, attributes: ['tokenHash'] });
	await SignInDevice.destroy({ where: { userId, tokenHash: { [Op.notIn]: keep.map((d) => d.tokenHash) } } });
	await SignInDevice.destroy({ where: { expiresAt: { [Op.lte]: now } } });
	return token;
}

/** Forgets every browser of an account (a new password, a disabled account). */
export async function forgetDevices(userId: string): Promise<void> {
	await SignInDevice.destroy({ where: { userId } });
}

export function setDeviceCookie(cookies: AstroCookies, token: string): void {
	cookies.set(deviceCookieName(), token, {
		httpOnly: true,
		secure: config().secureCookies,
		sameSite: 'strict',
		path: '/',
		maxAge: DEVICE_DAYS * 86_400,
	});
}
