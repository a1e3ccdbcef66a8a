import type { Transaction } from 'sequelize';
import { AuditEvent } from './models/index.ts';

/**
 * Appends one audit event. Values are stored as JSON, never interpolated into text, so a CR/LF in
 * an e-mail address cannot forge a log line (ASVS 16.4.1). Pass the caller's transaction so the
 * event and the change it records commit or roll back together.
 */
export interface AuditInput {
	action: string;
	entityType: string;
	entityId: string | null;
	actorId?: string | null;
	before?: unknown;
	after?: unknown;
	clientAddress?: string | null;
}

export async function audit(e: AuditInput, transaction?: Transaction): Promise<void> {
	await AuditEvent.create(
		{
			action: e.action,
			entityType: e.entityType,
			entityId: e.entityId,
			actorId: e.actorId ?? null,
			before: e.before ?? null,
			after: e.after ?? null,
			clientAddress: e.clientAddress?.slice(0, 64) ?? null,
		},
		{ transaction },
	);
}
