import type { MailInput } from './outbox.ts';

/**
 * The text of Meniscus's e-mails. Plain text only: values are never read as markup, and the names
 * they contain were refused if they held control characters, so no header can be injected.
 */
function linkMail(to: string, subject: string, name: string, lead: string, link: string, tail: string): MailInput {
	return { to, subject, text: [`Hello ${name},`, '', lead, '', link, '', tail].join('\n') };
}

export function invitationMail(to: string, name: string, link: string, hours: number): MailInput {
	return linkMail(
		to,
		'You have been invited to Meniscus',
		name,
		'An administrator has made you an account in Meniscus, the condition records of the spirit collection.\nChoose your password here to start:',
		link,
		`The link works once and for ${hours} hours. If you did not expect this, ignore this message.`,
	);
}

export function resetMail(to: string, name: string, link: string, hours: number): MailInput {
	return linkMail(
		to,
		'Reset your Meniscus password',
		name,
		'Someone asked to reset the password of your Meniscus account. To choose a new one, open:',
		link,
		`The link works once and for ${hours} hours. If it was not you, ignore this message: your password stays as it is.`,
	);
}
