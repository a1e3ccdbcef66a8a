/**
 * Fake SMTP server for development and tests: stands in for a real relay on
 * loopback and drops every message into a directory as one JSON file, so the
 * app's outgoing mail can be read back without any network service.
 * Never run this in production: it has no TLS and accepts any client and any login.
 */
import { randomBytes } from 'node:crypto';
import { mkdir, readdir, readFile, rename, unlink, writeFile } from 'node:fs/promises';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer, type SMTPServerDataStream, type SMTPServerSession } from 'smtp-server';
import { z } from 'zod';

/** Largest message accepted, in bytes; bigger ones are refused with 552. */
export const MAX_MESSAGE_BYTES = 10 * 1024 * 1024;

// Without TLS or auth, anything reachable from another host would be an open relay sink
const LOOPBACK_HOSTS = new Set(['127.0.0.1', '::1', 'localhost']);

/** Shape of one stored message; files that do not match are skipped on read. */
export const MailboxMessageSchema = z.object({
	id: z.string().min(1),
	receivedAt: z.iso.datetime(),
	envelopeFrom: z.string(),
	envelopeTo: z.array(z.string()),
	from: z.string(),
	to: z.string(),
	subject: z.string(),
	text: z.string(),
	html: z.string().nullable(),
	/** The names of the message's header lines, lower-cased, in order: a test sees one that should not be there. */
	headers: z.array(z.string()).default([]),
});

/** One message as stored in the mailbox directory. */
export type MailboxMessage = z.infer<typeof MailboxMessageSchema>;

/** Options for {@link startFakeSmtp}. */
export interface FakeSmtpOptions {
	/** TCP port; 0 lets the OS pick a free one (what the tests use). */
	port?: number;
	/** Interface to bind; must be a loopback address. */
	host?: string;
	/** Directory the JSON files go to; created if missing. */
	mailboxDir: string;
	/** Receives one line per refused or failed message; defaults to stderr. */
	log?: (line: string) => void;
}

/** A running fake server. */
export interface FakeSmtp {
	port: number;
	close(): Promise<void>;
}

const TOO_BIG = `Error: message exceeds fixed maximum message size ${MAX_MESSAGE_BYTES}`;

function smtpError(message: string, responseCode: number): Error & { responseCode: number } {
	return Object.assign(new Error(message), { responseCode });
}

function addressText(value: AddressObject | AddressObject[] | undefined): string {
	if (!value) return '';
	return (Array.isArray(value) ? value : [value]).map((a) => a.text).join(', ');
}

// Stops keeping chunks once over the limit: an oversized message still has to be
// drained before the 552 reply, but must not be held in memory while it is
function collect(stream: SMTPServerDataStream): Promise<Buffer> {
	return new Promise((resolve, reject) => {
		const chunks: Buffer[] = [];
		stream.on('data', (chunk: Buffer) => {
			if (!stream.sizeExceeded) chunks.push(chunk);
		});
		stream.once('error', reject);
		stream.once('end', () => resolve(Buffer.concat(chunks)));
	});
}

async function receive(stream: SMTPServerDataStream, session: SMTPServerSession, mailboxDir: string): Promise<void> {
	const receivedAt = new Date().toISOString();
	const raw = await collect(stream);
	if (stream.sizeExceeded) throw smtpError(TOO_BIG, 552);
	const mail = await simpleParser(raw);
	const id = `${receivedAt.replaceAll(':', '-')}-${randomBytes(6).toString('hex')}`;
	const message: MailboxMessage = {
		id,
		receivedAt,
		envelopeFrom: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
		envelopeTo: session.envelope.rcptTo.map((rcpt) => rcpt.address),
		from: addressText(mail.from),
		to: addressText(mail.to),
		subject: mail.subject ?? '',
		text: mail.text ?? '',
		html: typeof mail.html === 'string' ? mail.html : null,
		headers: mail.headerLines.map((h) => h.key),
	};
	// Temp file in the same directory so the rename is atomic: readers never see half a file.
	// mkdir again in case someone deleted the directory while the server runs
	await mkdir(mailboxDir, { recursive: true });
	const tmp = path.join(mailboxDir, `.${id}.tmp`);
	await writeFile(tmp, JSON.stringify(message, null, '\t'));
	await rename(tmp, path.join(mailboxDir, `${id}.json`));
}

/**
 * Starts the fake server on loopback. Resolves once it is listening, with the
 * actual port (useful with `port: 0`).
 */
export async function startFakeSmtp({
	port = 0,
	host = '127.0.0.1',
	mailboxDir,
	log = (line) => console.error(`[fake-smtp] ${line}`),
}: FakeSmtpOptions): Promise<FakeSmtp> {
	if (!LOOPBACK_HOSTS.has(host)) throw new Error(`fake SMTP must listen on loopback, not ${host}`);
	await mkdir(mailboxDir, { recursive: true });

	const server = new SMTPServer({
		authOptional: true,
		disabledCommands: ['STARTTLS'],
		size: MAX_MESSAGE_BYTES,
		logger: false,
		disableReverseLookup: true, // clients are local; a DNS lookup per connection only adds delay
		closeTimeout: 1000, // do not hold a dev shutdown for the default 30 s
		// AUTH is still advertised, so a mailer configured with credentials will try it:
		// accept anything rather than fail with 535
		onAuth(auth, _session, callback) {
			callback(null, { user: auth.username || 'anonymous' });
		},
		onData(stream, session, callback) {
			receive(stream, session, mailboxDir).then(
				() => callback(),
				(err: unknown) => {
					const reason = err instanceof Error ? err.message : String(err);
					log(`refused message in session ${session.id}: ${reason}`);
					// Anything but the size limit is our fault (parse or disk): transient 451
					callback(stream.sizeExceeded ? smtpError(TOO_BIG, 552) : smtpError('Error: message could not be stored', 451));
				},
			);
		},
	});

	await new Promise<void>((resolve, reject) => {
		server.once('error', reject);
		server.listen(port, host, () => {
			server.off('error', reject);
			// Client resets and timeouts arrive here; unhandled, they would crash the process
			server.on('error', (err) => log(`server error: ${err.message}`));
			resolve();
		});
	});

	return {
		port: (server.server.address() as AddressInfo).port,
		close: () => new Promise<void>((resolve) => server.close(() => resolve())),
	};
}

/** Reads stored messages, newest first; [] if the directory does not exist. */
export async function readMailbox(mailboxDir: string, { limit = 200 }: { limit?: number } = {}): Promise<MailboxMessage[]> {
	let names: string[];
	try {
		names = await readdir(mailboxDir);
	} catch (err) {
		if ((err as NodeJS.ErrnoException).code === 'ENOENT') return [];
		throw err;
	}
	// File names start with the receive time, so name order is time order
	const files = names.filter((name) => name.endsWith('.json') && !name.startsWith('.')).sort().reverse();
	const messages: MailboxMessage[] = [];
	for (const name of files) {
		if (messages.length >= limit) break;
		try {
			const parsed = MailboxMessageSchema.safeParse(JSON.parse(await readFile(path.join(mailboxDir, name), 'utf8')));
			if (parsed.success) messages.push(parsed.data);
		} catch {
			// Unreadable or not JSON: skip it rather than break the whole mailbox
		}
	}
	return messages;
}

/** Deletes the stored messages (tests). Only removes files this module writes. */
export async function clearMailbox(mailboxDir: string): Promise<void> {
	const names = await readdir(mailboxDir).catch(() => [] as string[]);
	const ours = names.filter((name) => name.endsWith('.json') || (name.startsWith('.') && name.endsWith('.tmp')));
	await Promise.all(ours.map((name) => unlink(path.join(mailboxDir, name)).catch(() => undefined)));
}
