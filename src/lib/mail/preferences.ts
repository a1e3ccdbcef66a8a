import { z } from 'zod';
import type { Role } from '../auth/roles.ts';

/**
 * The optional e-mails a person may turn off. Account mail (invitations, password resets) is not
 * listed: it is never optional. Every kind is on until its owner turns it off.
 */
export const MAIL_KINDS = ['checkSubmitted', 'riskSubmitted', 'checkReturned', 'checkApproved', 'riskReviewed', 'dueDigest'] as const;
export type MailKind = (typeof MAIL_KINDS)[number];

export const MailPreferencesSchema = z.object({
	checkSubmitted: z.boolean(),
	riskSubmitted: z.boolean(),
	checkReturned: z.boolean(),
	checkApproved: z.boolean(),
	riskReviewed: z.boolean(),
	dueDigest: z.boolean(),
});
export type MailPreferences = z.infer<typeof MailPreferencesSchema>;

/** PATCH body: some of the kinds, nothing else, at least one. */
export const MailPreferencesPatchSchema = MailPreferencesSchema.partial()
	.strict()
	.refine((p) => Object.keys(p).length > 0, { message: 'Name at least one kind of mail to turn on or off.' });
export type MailPreferencesPatch = z.infer<typeof MailPreferencesPatchSchema>;

export const DEFAULT_MAIL_PREFERENCES: MailPreferences = { checkSubmitted: true, riskSubmitted: true, checkReturned: true, checkApproved: true, riskReviewed: true, dueDigest: true };

/** What each kind is, and who receives it (the page shows a person the kinds of their role). */
export const MAIL_KIND_INFO: Record<MailKind, { label: string; hint: string; roles: readonly Role[] }> = {
	checkSubmitted: { label: 'A check is waiting for review', hint: 'When a conservator submits a condition check.', roles: ['reviewer'] },
	riskSubmitted: { label: 'A risk assessment is waiting for sign-off', hint: 'When a conservator asks for sign-off of a treatment’s risk assessment.', roles: ['reviewer'] },
	checkReturned: { label: 'My check was returned', hint: 'With the reviewer’s comments.', roles: ['conservator'] },
	checkApproved: { label: 'My check was approved', hint: 'When a reviewer approves a check you wrote.', roles: ['conservator'] },
	riskReviewed: { label: 'My risk assessment was signed off or returned', hint: 'With the reviewer’s comments.', roles: ['conservator'] },
	dueDigest: { label: 'Daily list of checks coming due', hint: 'Overdue checks and checks due within 14 days; not sent on days with none.', roles: ['conservator'] },
};

export const mailKindsFor = (role: Role): MailKind[] => MAIL_KINDS.filter((k) => MAIL_KIND_INFO[k].roles.includes(role));
