import { AuditEvent, User } from '../models/index.ts';
import type { HistoryEntry } from '../../specimen/view.ts';

/** A record's audit trail, newest first, with who did it and what each change was. */
export async function recordHistory(entityType: string, entityId: string, limit = 200): Promise<HistoryEntry[]> {
	const events = await AuditEvent.findAll({ where: { entityType, entityId }, order: [['id', 'DESC']], limit });
	const actorIds = [...new Set(events.map((e) => e.actorId).filter((x): x is string => !!x))];
	const actors = new Map((await User.findAll({ where: { id: actorIds } })).map((u) => [u.id, u.name]));
	return events.map((e) => {
		const before = (e.before ?? {}) as Record<string, unknown>;
		const after = (e.after ?? {}) as Record<string, unknown>;
		const fields = /[.-]create$/.test(e.action) ? [] : [...new Set([...Object.keys(before), ...Object.keys(after)])];
		return {
			id: Number(e.id),
			at: e.occurredAt.toISOString(),
			action: e.action,
			actor: e.actorId ? (actors.get(e.actorId) ?? null) : null,
			changes: fields.map((field) => ({ field, before: before[field] ?? null, after: after[field] ?? null })),
		};
	});
}
