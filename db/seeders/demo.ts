import crypto from 'node:crypto';
import type { Sequelize } from 'sequelize';
import { QueryTypes } from 'sequelize';
import { hashPassword } from '../../src/lib/server/auth/password.ts';
import type { Role } from '../../src/lib/auth/roles.ts';
import { DEMO_LOCATIONS, DEMO_SPECIMENS, DEMO_TOP_NOT_MEASURED, DEMO_USERS } from './demoData.ts';
import { seedDemoChecks } from './demoChecks.ts';
import { seedDemoTreatments } from './demoTreatments.ts';

/**
 * The demo collection: an invented teaching collection, its people and its jars. It goes only into
 * an empty database (no users and no specimens), so it can never touch real records.
 */
export { DEFAULT_DEMO_PASSWORD, demoPassword } from './demoPassword.mjs';

export type SeedResult = { seeded: true; users: number; specimens: number; checks: number } | { seeded: false; reason: string };

export async function seedDemo(sequelize: Sequelize, opts: { password: string; today?: Date }): Promise<SeedResult> {
	const [counts] = await sequelize.query<{ users: string; specimens: string }>(
		'SELECT (SELECT count(*) FROM users) AS users, (SELECT count(*) FROM specimens) AS specimens',
		{ type: QueryTypes.SELECT },
	);
	if (Number(counts?.users) > 0 || Number(counts?.specimens) > 0) {
		return { seeded: false, reason: 'the database already holds records' };
	}
	const hash = await hashPassword(opts.password);
	const today = opts.today ?? new Date();
	const day = (offset: number) => new Date(today.getTime() + offset * 86_400_000).toISOString().slice(0, 10);
	const checks = await sequelize.transaction(async (transaction) => {
		const qi = sequelize.getQueryInterface();
		const stamp = { created_at: today, updated_at: today };
		await qi.bulkInsert(
			'users',
			DEMO_USERS.map((u: { email: string; name: string; role: Role }) => ({ ...u, password_hash: hash, disabled: false, ...stamp })),
			{ transaction },
		);
		await qi.bulkInsert(
			'storage_locations',
			DEMO_LOCATIONS.map((l) => ({ code: l.code, name: l.name, notes: l.notes, flammable_limit_l: l.limitL, near_limit_percent: 80, temp_min_c: l.minC, temp_max_c: l.maxC, ...stamp })),
			{ transaction },
		);
		const locs = await sequelize.query<{ id: string; code: string }>('SELECT id, code FROM storage_locations', {
			type: QueryTypes.SELECT,
			transaction,
		});
		const locId = new Map(locs.map((l) => [l.code, l.id]));
		await qi.bulkInsert(
			'specimens',
			DEMO_SPECIMENS.map((s) => ({
				object_number: s.objectNumber,
				title: s.title,
				description: s.description,
				department: s.department,
				storage_location_id: locId.get(s.location) ?? null,
				preservative_recorded: s.preservativeRecorded,
				preservative_kind: s.preservativeKind,
				container_shape: s.shape,
				inner_width_mm: s.dims[0],
				inner_depth_mm: s.dims[1],
				inner_height_mm: s.dims[2],
				specimen_top_mm: DEMO_TOP_NOT_MEASURED.has(s.objectNumber) ? null : demoSpecimenTopMm(s.objectNumber, s.dims[2]),
				container_material: s.material,
				closure_type: s.closure,
				seal_type: s.seal,
				// bulkInsert does not serialise JSONB arrays itself.
				hazards: JSON.stringify(s.hazards),
				next_check_due: s.dueInDays === null ? null : day(s.dueInDays),
				version: 0,
				...stamp,
			})),
			{ transaction },
		);
		const people = await sequelize.query<{ id: string; role: Role }>(`SELECT id, role FROM users WHERE role IN ('conservator', 'reviewer')`, {
			type: QueryTypes.SELECT,
			transaction,
		});
		const idOf = (role: Role) => people.find((u) => u.role === role)!.id;
		const users = { conservatorId: idOf('conservator'), reviewerId: idOf('reviewer') };
		const n = await seedDemoChecks(sequelize, transaction, { today, users });
		await seedDemoTreatments(sequelize, transaction, users, today);
		return n;
	});
	return { seeded: true, users: DEMO_USERS.length, specimens: DEMO_SPECIMENS.length, checks };
}

/**
 * Where the seeder's drawings put each specimen's top: 0.70–0.79 of the inner height, from the same
 * hash of the object number that demoPhotos.ts draws with, so the record and the photographs agree.
 */
function demoSpecimenTopMm(objectNumber: string, innerHeightMm: number): number {
	const seed = parseInt(crypto.createHash('sha256').update(objectNumber).digest('hex').slice(0, 8), 16);
	return Math.round(innerHeightMm * (0.7 + (seed % 10) / 100));
}
