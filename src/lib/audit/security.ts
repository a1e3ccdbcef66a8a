import { z } from 'zod';

/**
 * The security log (ASVS 5.0 16.2–16.3; TESTPLAN A10): the audit events an administrator reads to
 * see who signed in, who was refused and what changed about accounts. They are ordinary audit rows;
 * this module says which actions belong to which kind, how a query is written, and what an answer
 * looks like. Times are always ISO 8601 in UTC (16.2.2); values are JSON, never text spliced into a
 * line, so CR/LF in them cannot forge an entry (16.4.1).
 */
export const SECURITY_KINDS = {
	authentication: {
		label: 'Sign-in and passwords',
		actions: ['sign-in', 'sign-in.failed', 'sign-in.throttled', 'sign-out', 'password.reset-request', 'password.reset-request-ignored', 'password.set-by-reset', 'password.set-by-invite'],
	},
	access: { label: 'Refused requests', actions: ['access.refused', 'request.cross-site-refused'] },
	accounts: { label: 'Accounts and roles', actions: ['user.first-admin', 'user.create', 'user.invite', 'user.update'] },
	downloads: { label: 'Originals and reports downloaded', actions: ['photo.original-downloaded', 'check.report-downloaded'] },
} as const;

export type SecurityKind = keyof typeof SECURITY_KINDS;
export const SECURITY_KIND_IDS = Object.keys(SECURITY_KINDS) as SecurityKind[];

export function actionsOf(kind: SecurityKind | 'all'): string[] {
	return kind === 'all' ? SECURITY_KIND_IDS.flatMap((k) => [...SECURITY_KINDS[k].actions]) : [...SECURITY_KINDS[kind].actions];
}

export function kindOf(action: string): SecurityKind | null {
	return SECURITY_KIND_IDS.find((k) => (SECURITY_KINDS[k].actions as readonly string[]).includes(action)) ?? null;
}

export const SECURITY_PAGE_MAX = 500;

export const SecurityQuerySchema = z
	.object({
		kind: z.enum(['all', ...SECURITY_KIND_IDS]).default('all'),
		/** Only events at or after this instant (ISO 8601 with a zone, or a date, read as UTC). */
		since: z.iso.datetime({ offset: true }).or(z.iso.date()).optional(),
		/** An address or its beginning, e.g. `192.0.2.` */
		address: z.string().trim().max(64).regex(/^[0-9a-fA-F.:]*$/, 'An address holds only digits, letters a–f, dots and colons.').optional(),
		/** Events older than this id (the `next` of the previous page). */
		before: z.coerce.number().int().positive().optional(),
		limit: z.coerce.number().int().min(1).max(SECURITY_PAGE_MAX).default(100),
		format: z.enum(['json', 'jsonl']).default('json'),
	})
	.strict();

export type SecurityQuery = z.output<typeof SecurityQuerySchema>;

export interface SecurityEvent {
	id: number;
	/** ISO 8601, UTC (ends in Z). */
	occurredAt: string;
	action: string;
	kind: SecurityKind | null;
	actor: { id: string; email: string; name: string } | null;
	entityType: string;
	entityId: string | null;
	/** The account the event is about, when it is one (a failed sign-in, a role change). */
	subject: { id: string; email: string; name: string } | null;
	clientAddress: string | null;
	detail: unknown;
}

export interface SecurityPage {
	events: SecurityEvent[];
	/** Pass as `before` for the next (older) page; null at the end. */
	next: number | null;
}

/** Keys whose values must never reach a log, at any depth (ASVS 16.2.5): dropped, not masked. */
const SECRET_KEY = /pass(word|phrase)?|secret|token|session|cookie|authori[sz]ation|hash/i;

/** A copy of an event's values without anything that looks like a secret. */
export function withoutSecrets(value: unknown, depth = 0): unknown {
	if (depth > 20 || value === null || typeof value !== 'object') return value;
	if (Array.isArray(value)) return value.map((v) => withoutSecrets(v, depth + 1));
	const out: Record<string, unknown> = {};
	for (const [k, v] of Object.entries(value)) if (!SECRET_KEY.test(k)) out[k] = withoutSecrets(v, depth + 1);
	return out;
}

/** One event per line, as JSON (JSON Lines): a line break inside a value is written as \n. */
export function toJsonLines(events: readonly SecurityEvent[]): string {
	return events.map((e) => JSON.stringify(e)).join('\n') + (events.length ? '\n' : '');
}

const DETAIL_WORDS: Record<string, string> = {
	why: 'reason',
	reason: 'reason',
	email: 'address tried',
	trustedDevice: 'known browser',
	method: 'method',
	origin: 'sent from',
	path: 'path',
};

const shown = (v: unknown): string => (typeof v === 'boolean' ? (v ? 'yes' : 'no') : typeof v === 'string' ? v : JSON.stringify(v));

/**
 * An event's values in words for the screen: for a change, each field that changed as
 * "field: before → after"; otherwise each value as "name: value".
 */
export function describeDetail(detail: unknown): string[] {
	const d = (detail ?? {}) as { before?: Record<string, unknown> | null; after?: Record<string, unknown> | null };
	const before = d.before && typeof d.before === 'object' ? d.before : null;
	const after = d.after && typeof d.after === 'object' ? d.after : null;
	if (before && after) {
		return Object.keys(after)
			.filter((k) => JSON.stringify(before[k]) !== JSON.stringify(after[k]))
			.map((k) => `${k}: ${shown(before[k])} → ${shown(after[k])}`);
	}
	return Object.entries(after ?? {})
		.filter(([, v]) => v !== null && v !== undefined)
		.map(([k, v]) => `${DETAIL_WORDS[k] ?? k}: ${shown(v)}`);
}
