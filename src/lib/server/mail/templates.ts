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

// Check notifications and the digest: plain text plus a simple HTML part with the same words.
// No images, no tracking, no styles beyond what a mail reader shows by default.

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
/** Subjects hold object numbers and names: keep them on one line whatever the record says. */
const oneLine = (s: string) => s.replace(/[\u0000-\u001f\u007f]+/g, ' ').trim();

type Block = { p: string } | { link: string } | { quote: string } | { list: string[] };

function composed(to: string, subject: string, name: string, blocks: Block[], footer: string): MailInput {
	const text: string[] = [`Hello ${name},`];
	const html: string[] = [`<p>Hello ${escapeHtml(name)},</p>`];
	for (const b of [...blocks, { p: footer }]) {
		text.push('');
		if ('p' in b) {
			text.push(b.p);
			html.push(`<p>${escapeHtml(b.p)}</p>`);
		} else if ('link' in b) {
			text.push(b.link);
			html.push(`<p><a href="${escapeHtml(b.link)}">${escapeHtml(b.link)}</a></p>`);
		} else if ('quote' in b) {
			text.push(...b.quote.split('\n').map((l) => `> ${l}`));
			html.push(`<blockquote>${escapeHtml(b.quote).replaceAll('\n', '<br>')}</blockquote>`);
		} else {
			text.push(...b.list.map((l) => `- ${l}`));
			html.push(`<ul>${b.list.map((l) => `<li>${escapeHtml(l)}</li>`).join('')}</ul>`);
		}
	}
	return { to, subject: oneLine(subject), text: text.join('\n'), html: `<!doctype html><html><body>${html.join('\n')}</body></html>` };
}

const PREFS_FOOTER = (origin: string) => `You get this mail because it is turned on in your mail settings: ${origin}/account/mail`;

export interface CheckMailFacts {
	objectNumber: string;
	title: string;
	checkedOn: string;
	link: string;
	origin: string;
}

export function checkSubmittedMail(to: string, name: string, c: CheckMailFacts, examiner: string): MailInput {
	return composed(
		to,
		`Check of ${c.objectNumber} waiting for review`,
		name,
		[{ p: `${examiner} has submitted the condition check of ${c.objectNumber} (${c.title}), examined on ${c.checkedOn}. It is waiting for review:` }, { link: c.link }],
		PREFS_FOOTER(c.origin),
	);
}

export function checkReturnedMail(to: string, name: string, c: CheckMailFacts, reviewer: string, comment: string): MailInput {
	return composed(
		to,
		`Check of ${c.objectNumber} returned with comments`,
		name,
		[
			{ p: `${reviewer} has returned your condition check of ${c.objectNumber} (${c.title}), examined on ${c.checkedOn}, with this comment:` },
			{ quote: comment },
			{ p: 'Edit the check and submit it again here:' },
			{ link: c.link },
		],
		PREFS_FOOTER(c.origin),
	);
}

export function checkApprovedMail(to: string, name: string, c: CheckMailFacts, reviewer: string, comment: string | null): MailInput {
	return composed(
		to,
		`Check of ${c.objectNumber} approved`,
		name,
		[
			{ p: `${reviewer} has approved your condition check of ${c.objectNumber} (${c.title}), examined on ${c.checkedOn}.` },
			...(comment ? [{ quote: comment }] : []),
			{ link: c.link },
		],
		PREFS_FOOTER(c.origin),
	);
}

export interface DigestLine {
	objectNumber: string;
	title: string;
	due: string;
	link: string;
}

export interface DigestFacts {
	date: string;
	overdue: { shown: DigestLine[]; total: number };
	dueSoon: { shown: DigestLine[]; total: number };
	days: number;
	registerLink: string;
	origin: string;
}

function digestGroup(heading: string, g: DigestFacts['overdue']): Block[] {
	if (g.total === 0) return [];
	const more = g.total - g.shown.length;
	return [
		{ p: `${heading} (${g.total}):` },
		{ list: g.shown.map((l) => `${l.objectNumber}, ${l.title}: due ${l.due}, ${l.link}`) },
		...(more > 0 ? [{ p: `… and ${more} more.` }] : []),
	];
}

export function dueDigestMail(to: string, name: string, d: DigestFacts): MailInput {
	return composed(
		to,
		`Checks coming due: ${d.overdue.total} overdue, ${d.dueSoon.total} within ${d.days} days`,
		name,
		[
			{ p: `The condition checks of the collection that are overdue or due within ${d.days} days, as of ${d.date}:` },
			...digestGroup('Overdue', d.overdue),
			...digestGroup(`Due within ${d.days} days`, d.dueSoon),
			{ p: 'The overdue jars, in the register:' },
			{ link: d.registerLink },
		],
		PREFS_FOOTER(d.origin),
	);
}

export interface RiskMailFacts {
	objectNumber: string;
	title: string;
	treatment: string;
	link: string;
	origin: string;
}

export function riskSubmittedMail(to: string, name: string, r: RiskMailFacts, author: string, hazards: string[]): MailInput {
	return composed(
		to,
		`Risk assessment for ${r.objectNumber} waiting for sign-off`,
		name,
		[
			{ p: `${author} asks for sign-off of the risk assessment for “${r.treatment}” on ${r.objectNumber} (${r.title}). Work steps cannot start until it is signed off. Hazards assessed:` },
			{ list: hazards },
			{ link: r.link },
		],
		PREFS_FOOTER(r.origin),
	);
}

export function riskReviewedMail(to: string, name: string, r: RiskMailFacts, reviewer: string, decision: 'sign-off' | 'return', comment: string | null): MailInput {
	const signed = decision === 'sign-off';
	return composed(
		to,
		signed ? `Risk assessment for ${r.objectNumber} signed off` : `Risk assessment for ${r.objectNumber} returned with comments`,
		name,
		[
			{ p: signed ? `${reviewer} has signed off the risk assessment for “${r.treatment}” on ${r.objectNumber} (${r.title}). The work steps can now be started.` : `${reviewer} has returned the risk assessment for “${r.treatment}” on ${r.objectNumber} (${r.title}) with this comment:` },
			...(comment ? [{ quote: comment }] : []),
			{ link: r.link },
		],
		PREFS_FOOTER(r.origin),
	);
}
