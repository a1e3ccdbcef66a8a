import { Lucia, TimeSpan } from 'lucia';
import { NodePostgresAdapter } from '@lucia-auth/adapter-postgresql';
import { config } from '../config.ts';
import { pgPool } from '../db.ts';
import type { Role } from '../../auth/roles.ts';
import {
	DEFAULT_SESSION_POLICY,
	nextExpiry,
	sessionVerdict,
	shouldTouch,
	type SessionPolicy,
} from '../../auth/sessionPolicy.ts';

/**
 * The only module that knows Lucia. Lucia 3 is no longer maintained upstream (TESTPLAN.md [LV3]),
 * so the rest of the app uses the functions below and a replacement can be dropped in here. Known
 * gap: Lucia 3 stores the session id itself; current guidance (lucia-auth.com/sessions/basic) is an
 * id plus a secret whose SHA-256 is stored and compared in constant time. That replacement needs no
 * change outside this file (the cookie value becomes "id.secret", user_sessions gains secret_hash).
 * Lucia makes the session ids (200 random bits), the cookies and the deletions. Its own
 * `validateSession` is not used: its sliding expiry moves the deadline to a full span whenever half
 * has passed, which cannot express "30 minutes idle, 12 hours at most". The deadline is ours
 * (sessionPolicy.ts), checked with one query that also reads the user afresh.
 */
export interface SignedInUser {
	id: string;
	email: string;
	name: string;
	role: Role;
}

interface DbUser {
	email: string;
	name: string;
	role: Role;
	disabled: boolean;
}
interface DbSession {
	created_at: Date;
	user_agent: string | null;
}

declare module 'lucia' {
	interface Register {
		Lucia: ReturnType<typeof makeLucia>;
		DatabaseUserAttributes: DbUser;
		DatabaseSessionAttributes: DbSession;
	}
}

function makeLucia() {
	const c = config();
	return new Lucia(new NodePostgresAdapter(pgPool(), { user: 'users', session: 'user_sessions' }), {
		// The first idle deadline, written by createSession; later ones are ours (checkSession).
		sessionExpiresIn: new TimeSpan(c.MENISCUS_SESSION_IDLE_MINUTES, 'm'),
		sessionCookie: {
			// __Host- needs Secure; over plain http on loopback (development) the plain name is used.
			name: c.secureCookies ? '__Host-meniscus_session' : 'meniscus_session',
			expires: false,
			attributes: { secure: c.secureCookies, sameSite: 'lax', path: '/' },
		},
		getUserAttributes: (a) => ({ email: a.email, name: a.name, role: a.role, disabled: a.disabled }),
		getSessionAttributes: (a) => ({ createdAt: new Date(a.created_at) }),
	});
}

let instance: ReturnType<typeof makeLucia> | undefined;
const lucia = () => (instance ??= makeLucia());

export function sessionPolicy(): SessionPolicy {
	const c = config();
	return {
		...DEFAULT_SESSION_POLICY,
		idleMs: c.MENISCUS_SESSION_IDLE_MINUTES * 60_000,
		absoluteMs: c.MENISCUS_SESSION_ABSOLUTE_HOURS * 3_600_000,
	};
}

export type CookieSpec = ReturnType<ReturnType<typeof makeLucia>['createSessionCookie']>;

export function sessionCookieName(): string {
	return lucia().sessionCookieName;
}

/** Starts a new session (a new random id each sign-in: no fixation) and returns its cookie. */
export async function startSession(userId: string, userAgent: string | null, now = new Date()): Promise<CookieSpec> {
	const session = await lucia().createSession(userId, {
		created_at: now,
		user_agent: userAgent?.slice(0, 300) ?? null,
	});
	return lucia().createSessionCookie(session.id);
}

export function blankCookie(): CookieSpec {
	return lucia().createBlankSessionCookie();
}

export type SessionCheck =
	| { user: SignedInUser; sessionId: string }
	| { user: null; reason: 'none' | 'expired' | 'disabled' };

/**
 * The signed-in user behind a session id, read fresh from the database on every request so that a
 * changed role or a disabled account takes effect at once. Expired sessions are deleted.
 */
export async function checkSession(sessionId: string | undefined, now = new Date()): Promise<SessionCheck> {
	if (!sessionId) return { user: null, reason: 'none' };
	const { rows } = await pgPool().query<{
		expires_at: Date;
		created_at: Date;
		id: string;
		email: string;
		name: string;
		role: Role;
		disabled: boolean;
	}>(
		`SELECT s.expires_at, s.created_at, u.id, u.email, u.name, u.role, u.disabled
		 FROM user_sessions s JOIN users u ON u.id = s.user_id WHERE s.id = $1`,
		[sessionId],
	);
	const row = rows[0];
	if (!row) return { user: null, reason: 'none' };
	const policy = sessionPolicy();
	const s = { createdAt: row.created_at, expiresAt: row.expires_at };
	if (sessionVerdict(s, now, policy) !== 'valid') {
		await lucia().invalidateSession(sessionId);
		return { user: null, reason: 'expired' };
	}
	if (row.disabled) {
		await lucia().invalidateUserSessions(row.id);
		return { user: null, reason: 'disabled' };
	}
	if (shouldTouch(s, now, policy)) {
		await pgPool().query('UPDATE user_sessions SET expires_at = $1 WHERE id = $2', [
			nextExpiry(s.createdAt, now, policy),
			sessionId,
		]);
	}
	return { user: { id: row.id, email: row.email, name: row.name, role: row.role }, sessionId };
}

export async function endSession(sessionId: string): Promise<void> {
	await lucia().invalidateSession(sessionId);
}

export async function endAllSessions(userId: string): Promise<void> {
	await lucia().invalidateUserSessions(userId);
}
