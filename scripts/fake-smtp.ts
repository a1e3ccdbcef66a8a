/**
 * Runs the fake SMTP server until SIGINT/SIGTERM (development only).
 * Usage: tsx scripts/fake-smtp.ts [--port 2525] [--dir var/mailbox] [--host 127.0.0.1]
 */
import path from 'node:path';
import { parseArgs } from 'node:util';
import { startFakeSmtp } from '../src/lib/server/mail/fakeSmtp.ts';

const { values } = parseArgs({
	options: {
		port: { type: 'string', default: '2525' },
		dir: { type: 'string', default: 'var/mailbox' },
		host: { type: 'string', default: '127.0.0.1' },
	},
});

const port = Number(values.port);
if (!Number.isInteger(port) || port < 0 || port > 65535) {
	console.error(`fake-smtp: invalid --port ${values.port}`);
	process.exit(2);
}
const mailboxDir = path.resolve(values.dir);

try {
	const smtp = await startFakeSmtp({ port, host: values.host, mailboxDir });
	const shownHost = values.host.includes(':') ? `[${values.host}]` : values.host;
	console.log(`fake-smtp listening on smtp://${shownHost}:${smtp.port} (mailbox ${mailboxDir})`);
	let stopping = false;
	const stop = (): void => {
		// A second signal means the user does not want to wait for open sessions
		if (stopping) process.exit(1);
		stopping = true;
		smtp.close().then(() => process.exit(0));
	};
	process.on('SIGINT', stop);
	process.on('SIGTERM', stop);
} catch (err) {
	console.error(`fake-smtp: could not start: ${err instanceof Error ? err.message : String(err)}`);
	process.exit(1);
}
