import path from 'node:path';
import { z } from 'zod';

/**
 * The server's settings, read once from the environment and checked, so a wrong setting stops the
 * server at start with a message instead of failing on some later request.
 */
const EnvSchema = z.object({
	DATABASE_URL: z.string().min(1, 'DATABASE_URL is not set: start the app with `npm start`.'),
	/** The address people use, e.g. https://meniscus.example.org; decides Secure cookies. */
	MENISCUS_PUBLIC_URL: z.url().default('http://127.0.0.1:4321'),
	SMTP_HOST: z.string().default('127.0.0.1'),
	SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(2525),
	SMTP_SECURE: z.enum(['true', 'false']).default('false'),
	SMTP_USER: z.string().optional(),
	SMTP_PASSWORD: z.string().optional(),
	MAIL_FROM: z.string().default('Meniscus <meniscus@example.org>'),
	/** Folder the local fake SMTP server writes to; set only in development and tests. */
	MENISCUS_MAILBOX_DIR: z.string().optional(),
	MENISCUS_SESSION_IDLE_MINUTES: z.coerce.number().positive().max(24 * 60).default(30),
	MENISCUS_SESSION_ABSOLUTE_HOURS: z.coerce.number().positive().max(24 * 30).default(12),
	MENISCUS_TOKEN_HOURS: z.coerce.number().positive().max(24 * 14).default(24),
	/** Where uploads, master originals and derivatives live; never a folder the web server serves. */
	MENISCUS_UPLOADS_DIR: z.string().min(1).default('uploads').transform((p) => path.resolve(p)),
	/** Photos processed at once by one worker process; each uses MENISCUS_SHARP_THREADS threads. */
	MENISCUS_PHOTO_JOBS: z.coerce.number().int().min(1).max(16).default(1),
	MENISCUS_SHARP_THREADS: z.coerce.number().int().min(1).max(64).default(1),
	/** The photo worker's nice value (0 = as the web server, 19 = lowest): it yields to the app. */
	MENISCUS_WORKER_NICE: z.coerce.number().int().min(0).max(19).default(10),
	/** Minutes between reconciler passes in the worker (it also runs when the worker starts). */
	MENISCUS_RECONCILE_MINUTES: z.coerce.number().positive().max(24 * 60).default(10),
	/** Each master is re-hashed when its last fixity check is older than this. */
	MENISCUS_FIXITY_DAYS: z.coerce.number().positive().max(3650).default(7),
});

export type Config = z.infer<typeof EnvSchema> & { secureCookies: boolean };

let cached: Config | undefined;

export function config(): Config {
	if (cached) return cached;
	const parsed = EnvSchema.safeParse(process.env);
	if (!parsed.success) {
		const lines = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
		throw new Error(`Meniscus cannot start; fix these settings:\n${lines.join('\n')}`);
	}
	cached = { ...parsed.data, secureCookies: parsed.data.MENISCUS_PUBLIC_URL.startsWith('https:') };
	return cached;
}
