import { inject } from 'vitest';
import { db } from '../../src/lib/server/db.ts';
import { User } from '../../src/lib/server/models/index.ts';
import { hashPassword } from '../../src/lib/server/auth/password.ts';
import { startSession } from '../../src/lib/server/auth/lucia.ts';
import type { Role } from '../../src/lib/auth/roles.ts';
import { uniqueEmail, useTestDatabase } from './server.ts';

/** Users and sessions made straight in the test database (call useTestDatabase() first). */
export async function makeUser(role: Role, opts: { password?: string; tag?: string } = {}) {
	useTestDatabase();
	db();
	const password = opts.password ?? inject('demoPassword');
	const user = await User.create({
		email: uniqueEmail(opts.tag ?? role),
		name: `Test ${role}`,
		role,
		passwordHash: await hashPassword(password),
		lastSignInAt: null,
	});
	return { user, password };
}

/** A session cookie for a user, as if they had just signed in. */
export async function cookieFor(userId: string): Promise<string> {
	const c = await startSession(userId, 'vitest');
	return `${c.name}=${c.value}`;
}

/** A new user of `role` with a session cookie, for tests that act as several people. */
export async function signedInUser(role: Role, tag?: string): Promise<{ id: string; cookie: string }> {
	const { user } = await makeUser(role, { tag });
	return { id: user.id, cookie: await cookieFor(user.id) };
}
