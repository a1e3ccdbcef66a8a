import { z } from 'zod';
import { ROLES } from '../auth/roles.ts';
import { PASSWORD_MAX } from '../auth/passwordPolicy.ts';

/** E-mail addresses are compared in lower case; 254 is the longest a mailbox can be (RFC 5321). */
export const EmailSchema = z
	.string()
	.trim()
	.max(254, 'An e-mail address has at most 254 characters.')
	.pipe(z.email('Enter an e-mail address such as name@example.org.'))
	.transform((e) => e.toLowerCase());

export const NameSchema = z
	.string()
	.trim()
	.min(1, 'Give a name.')
	.max(120, 'A name has at most 120 characters.')
	.refine((n) => !/[\u0000-\u001f\u007f]/.test(n), 'A name cannot hold control characters.');

export const RoleSchema = z.enum(ROLES, { error: 'Choose one of the four roles.' });

/** The sign-in form. The password is not trimmed: every character counts. */
export const SignInSchema = z.object({
	email: EmailSchema,
	password: z.string().min(1, 'Enter your password.').max(PASSWORD_MAX * 4, 'That password is too long.'),
	next: z.string().max(2000).optional(),
});

export const CreateUserSchema = z
	.object({ email: EmailSchema, name: NameSchema, role: RoleSchema })
	.strict();

export const UpdateUserSchema = z
	.object({ name: NameSchema, role: RoleSchema, disabled: z.boolean() })
	.partial()
	.strict()
	.refine((v) => Object.keys(v).length > 0, 'Nothing to change.');

/** A user as the API shows it: never the hash, never a session. */
export const UserViewSchema = z.object({
	id: z.string(),
	email: z.string(),
	name: z.string(),
	role: RoleSchema,
	disabled: z.boolean(),
	hasPassword: z.boolean(),
	lastSignInAt: z.string().nullable(),
	createdAt: z.string(),
});
export type UserView = z.infer<typeof UserViewSchema>;
