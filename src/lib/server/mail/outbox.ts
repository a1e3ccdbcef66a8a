import nodemailer, { type Transporter } from 'nodemailer';
import { Op, type Transaction } from 'sequelize';
import { config } from '../config.ts';
import { db } from '../db.ts';
import { OutgoingMail } from '../models/index.ts';

/**
 * Mail goes through the outbox table: `enqueueMail` inside the transaction of the change that
 * causes it, then the sender delivers. A mail server that is down delays mail (retried with
 * growing waits, up to MAX_ATTEMPTS) and never loses it or undoes the change (TESTPLAN F8).
 */
export const MAX_ATTEMPTS = 8;
const RETRY_BASE_MS = 30_000;

export interface MailInput {
	to: string;
	subject: string;
	text: string;
	/** A simple HTML part with the same content; values in it are escaped by the template. */
	html?: string;
}

export async function enqueueMail(m: MailInput, transaction?: Transaction): Promise<void> {
	await OutgoingMail.create(
		{ toAddress: m.to, subject: m.subject, textBody: m.text, htmlBody: m.html ?? null, lastError: null, sentAt: null },
		{ transaction },
	);
	if (transaction) transaction.afterCommit(() => kickOutbox());
	else kickOutbox();
}

let transporter: Transporter | undefined;
function transport(): Transporter {
	const c = config();
	transporter ??= nodemailer.createTransport({
		host: c.SMTP_HOST,
		port: c.SMTP_PORT,
		secure: c.SMTP_SECURE === 'true',
		// The local fake speaks plain SMTP on loopback; a real server gets STARTTLS when it offers it.
		ignoreTLS: c.SMTP_HOST === '127.0.0.1' && c.SMTP_SECURE !== 'true',
		auth: c.SMTP_USER ? { user: c.SMTP_USER, pass: c.SMTP_PASSWORD ?? '' } : undefined,
		connectionTimeout: 10_000,
		greetingTimeout: 10_000,
		socketTimeout: 20_000,
	});
	return transporter;
}

let running: Promise<number> | null = null;
let again = false;

/**
 * Sends every message that is due; returns how many were sent. One pass at a time per process; a
 * kick during a pass makes it look again before it ends, so mail queued meanwhile does not wait for
 * the timer. Each message is claimed with FOR UPDATE SKIP LOCKED until its outcome is written, so
 * the app and the worker (both send) never deliver one message twice. A message is tried at most
 * once per pass.
 */
export function deliverDue(now?: Date): Promise<number> {
	if (running) {
		again = true;
		return running;
	}
	running = (async () => {
		db();
		let sent = 0;
		const tried: number[] = [];
		try {
			do {
				again = false;
				for (;;) {
					const outcome = await deliverOne(now ?? new Date(), tried);
					if (outcome === 'none') break;
					if (outcome === 'sent') sent++;
				}
			} while (again);
		} finally {
			running = null;
		}
		return sent;
	})();
	return running;
}

async function deliverOne(now: Date, tried: number[]): Promise<'sent' | 'failed' | 'none'> {
	return db().transaction(async (transaction) => {
		const m = await OutgoingMail.findOne({
			where: { status: 'queued', nextAttemptAt: { [Op.lte]: now }, ...(tried.length ? { id: { [Op.notIn]: tried } } : {}) },
			order: [['id', 'ASC']],
			lock: transaction.LOCK.UPDATE,
			skipLocked: true,
			transaction,
		});
		if (!m) return 'none';
		tried.push(m.id);
		try {
			await transport().sendMail({ from: config().MAIL_FROM, to: m.toAddress, subject: m.subject, text: m.textBody, ...(m.htmlBody ? { html: m.htmlBody } : {}) });
			await m.update({ status: 'sent', sentAt: new Date(), attempts: m.attempts + 1, lastError: null }, { transaction });
			return 'sent';
		} catch (err) {
			const attempts = m.attempts + 1;
			await m.update(
				{
					attempts,
					status: attempts >= MAX_ATTEMPTS ? 'failed' : 'queued',
					nextAttemptAt: new Date(Date.now() + RETRY_BASE_MS * 2 ** (attempts - 1)),
					lastError: String((err as Error).message ?? err).slice(0, 500),
				},
				{ transaction },
			);
			return 'failed';
		}
	});
}

function kickOutbox(): void {
	deliverDue().catch((err) => console.error('[mail] delivery pass failed:', (err as Error).message));
}

let timer: NodeJS.Timeout | undefined;

/** Starts the periodic sender of this process (idempotent); it does not keep the process alive. */
export function startOutboxWorker(everyMs = 15_000): void {
	if (timer) return;
	timer = setInterval(kickOutbox, everyMs);
	timer.unref();
	kickOutbox();
}
