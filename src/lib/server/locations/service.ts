import { db } from '../db.ts';
import { audit } from '../audit.ts';
import { StorageLocation } from '../models/index.ts';
import { zodFields, type FieldError } from '../http.ts';
import { LocationLimitsSchema, type LocationLimits, type LocationView } from '../../locations/schema.ts';

/** Storage locations as the API shows them, and the administrator's changes to a store's limits. */
export function locationView(l: StorageLocation): LocationView {
	return {
		id: l.id,
		code: l.code,
		name: l.name,
		notes: l.notes,
		flammableLimitL: l.flammableLimitL ?? null,
		nearLimitPercent: l.nearLimitPercent ?? 80,
		tempMinC: l.tempMinC ?? null,
		tempMaxC: l.tempMaxC ?? null,
	};
}

const limitsOf = (l: StorageLocation): LocationLimits => ({ flammableLimitL: l.flammableLimitL, nearLimitPercent: l.nearLimitPercent, tempMinC: l.tempMinC, tempMaxC: l.tempMaxC });

/** Stored to the columns' precision (0.1 L, 0.1 °C), so the audit records what was kept. */
const tenth = (n: number | null) => (n === null ? null : Math.round(n * 10) / 10);

export type LimitsResult = { ok: true; location: LocationView } | { ok: false; status: 400 | 404; message: string; fields: FieldError[] };

/**
 * Changes some of a store's limits. The change is merged with what the store has and checked as a
 * whole (the coolest cannot pass the warmest), then saved with its audit event in one transaction.
 */
export async function updateLimits(id: string, change: Partial<Record<keyof LocationLimits, unknown>>, actor: { id: string; clientAddress: string | null }): Promise<LimitsResult> {
	return db().transaction(async (transaction) => {
		const l = await StorageLocation.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
		if (!l) return { ok: false, status: 404, message: 'No such storage location.', fields: [] };
		const before = limitsOf(l);
		const parsed = LocationLimitsSchema.safeParse({ ...before, ...change });
		if (!parsed.success) return { ok: false, status: 400, message: 'Some values are not acceptable.', fields: zodFields(parsed.error) };
		const after: LocationLimits = { ...parsed.data, flammableLimitL: tenth(parsed.data.flammableLimitL), tempMinC: tenth(parsed.data.tempMinC), tempMaxC: tenth(parsed.data.tempMaxC) };
		l.set(after);
		await l.save({ transaction });
		await audit({ action: 'location.limits', entityType: 'location', entityId: l.id, actorId: actor.id, before, after, clientAddress: actor.clientAddress }, transaction);
		return { ok: true, location: locationView(l) };
	});
}
