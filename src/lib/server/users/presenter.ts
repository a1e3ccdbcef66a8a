import type { User } from '../models/index.ts';
import type { UserView } from '../../users/schema.ts';

/** A user as the API shows it: no hash, no sessions. */
export function userView(u: User): UserView {
	return {
		id: u.id,
		email: u.email,
		name: u.name,
		role: u.role,
		disabled: u.disabled,
		hasPassword: u.passwordHash !== null,
		lastSignInAt: u.lastSignInAt?.toISOString() ?? null,
		createdAt: u.createdAt.toISOString(),
	};
}
