import { Op, type WhereOptions } from 'sequelize';
import { AuditEvent, User } from './models/index.ts';
import { actionsOf, kindOf, withoutSecrets, type SecurityEvent, type SecurityPage, type SecurityQuery } from '../audit/security.ts';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** The security log: audit events of the security kinds, newest first, a page at a time. */
export async function securityEvents(q: SecurityQuery): Promise<SecurityPage> {
	const where: WhereOptions<AuditEvent> = { action: { [Op.in]: actionsOf(q.kind) } };
	if (q.since) Object.assign(where, { occurredAt: { [Op.gte]: new Date(q.since.length === 10 ? `${q.since}T00:00:00Z` : q.since) } });
	// LIKE with the address as a prefix; the schema admits only hex digits, dots and colons, so no wildcard.
	if (q.address) Object.assign(where, { clientAddress: { [Op.like]: `${q.address}%` } });
	if (q.before) Object.assign(where, { id: { [Op.lt]: q.before } });
	const rows = await AuditEvent.findAll({ where, order: [['id', 'DESC']], limit: q.limit + 1 });
	const page = rows.slice(0, q.limit);
	const userIds = page.flatMap((r) => [r.actorId, r.entityType === 'user' ? r.entityId : null]).filter((id): id is string => id !== null && UUID.test(id));
	const users = new Map((await User.findAll({ where: { id: [...new Set(userIds)] }, attributes: ['id', 'email', 'name'] })).map((u) => [u.id, { id: u.id, email: u.email, name: u.name }]));
	const events = page.map((r): SecurityEvent => {
		return {
			id: Number(r.id),
			occurredAt: r.occurredAt.toISOString(),
			action: r.action,
			kind: kindOf(r.action),
			actor: (r.actorId && users.get(r.actorId)) || null,
			entityType: r.entityType,
			entityId: r.entityId,
			subject: (r.entityType === 'user' && r.entityId && users.get(r.entityId)) || null,
			clientAddress: r.clientAddress,
			detail: withoutSecrets({ before: r.before ?? undefined, after: r.after ?? undefined }),
		};
	});
	return { events, next: rows.length > q.limit ? events.at(-1)!.id : null };
}
