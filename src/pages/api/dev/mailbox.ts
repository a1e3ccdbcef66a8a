import type { APIRoute } from 'astro';
import { json } from '../../../lib/server/http.ts';
import { config } from '../../../lib/server/config.ts';
import { readMailbox } from '../../../lib/server/mail/fakeSmtp.ts';

/** What the local fake SMTP server caught (development only; empty when real SMTP is used). */
export const GET: APIRoute = async () => {
	const dir = config().MENISCUS_MAILBOX_DIR;
	if (!dir) return json({ enabled: false, messages: [] });
	return json({ enabled: true, messages: await readMailbox(dir, { limit: 100 }) });
};
