import type { MailInput } from './outbox.ts';

/**
 * The text of Meniscus's e-mails. Plain text only: values are never read as markup, and the names
 * they contain were refused if they held control characters, so no header can be injected.
 */
export function invitationMail(to: string, name: string, link: string, hours: number): MailInput {
	return {
		to,
		subject: 'You have been invited to Meniscus',
		text: [
			`Hello ${name},`,
			'',
			'An administrator has made you an account in Meniscus, the condition records of the spirit collection.',
			'Choose your password here to start:',
			'',
			link,
			'',
			`The link works once and for ${hours} hours. If you did not expect this, ignore this message.`,
		].join('\n'),
	};
}

export function resetMail(to: string, name: string, link: string, hours: number): MailInput {
	return {
		to,
		subject: 'Reset your Meniscus password',
		text: [
			`Hello ${name},`,
			'',
			'Someone asked to reset the password of your Meniscus account. To choose a new one, open:',
			'',
			link,
			'',
			`The link works once and for ${hours} hours. If it was not you, ignore this message: your password stays as it is.`,
		].join('\n'),
	};
}
