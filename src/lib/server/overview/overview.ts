import { QueryTypes } from 'sequelize';
import { db } from '../db.ts';
import { StorageLocation } from '../models/index.ts';
import { OverviewSchema, type Overview, type OverviewQuery } from '../../overview/schema.ts';
import { figures } from './figures.ts';
import { fluidLoss } from './fluidLoss.ts';
import { airspaceAtRisk, inventory } from './stores.ts';

/**
 * The collection overview for GET /api/overview: counts, fluid loss, store inventories and
 * airspace, for the jars in the chosen collection and location. Parsed with its own schema before
 * it leaves, so the island's type is what the server sends.
 */
export async function collectionOverview(q: OverviewQuery, now = new Date()): Promise<Overview> {
	const today = now.toISOString().slice(0, 10);
	const sequelize = db();
	const [locations, collections] = await Promise.all([
		StorageLocation.findAll({ order: [['code', 'ASC']] }),
		sequelize.query<{ department: string }>(`SELECT DISTINCT department FROM specimens WHERE deleted_at IS NULL AND department <> '' ORDER BY 1`, { type: QueryTypes.SELECT }),
	]);
	const [counts, loss, [stores, airspace]] = await Promise.all([
		figures(q, today),
		fluidLoss(q, today),
		// The airspace check offers cooler stores only where there is room under their limit.
		inventory(q, locations).then(async (s) => [s, await airspaceAtRisk(q, locations, s)] as const),
	]);
	return OverviewSchema.parse({
		asOf: today,
		filters: { collection: q.collection ?? null, location: q.location ?? null },
		collections: collections.map((c) => c.department),
		locations: locations.map((l) => ({ id: l.id, code: l.code, name: l.name })),
		...counts,
		fluidLoss: loss,
		inventory: stores.filter((s) => !q.location || s.location.id === q.location),
		airspace,
	});
}
