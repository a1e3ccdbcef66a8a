import { afterAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import { QueryTypes } from 'sequelize';
import { createDatabase } from '../../db/cluster.mjs';
import { openSequelize } from '../../src/lib/server/db.ts';
import { migrateDownAll, migrateUp } from '../../db/migrate.ts';

/** Migrations on a database of their own in the test cluster: up, down to nothing, up again. */
describe('migrations', () => {
	const name = `migrations_${process.pid}`;
	let sequelize: ReturnType<typeof openSequelize> | undefined;
	const tables = async () =>
		(
			await sequelize!.query<{ t: string }>(
				`SELECT table_name AS t FROM information_schema.tables WHERE table_schema = 'public' AND table_name <> 'schema_migrations' ORDER BY 1`,
				{ type: QueryTypes.SELECT },
			)
		).map((r) => r.t);

	afterAll(async () => {
		await sequelize?.close();
	});

	it('go up, down and up again on an empty database', async () => {
		await createDatabase({ dataDir: inject('clusterDataDir'), port: inject('clusterPort'), name });
		sequelize = openSequelize(inject('databaseUrl').replace(/\/[^/]+$/, `/${name}`));
		expect(await migrateUp(sequelize)).toEqual(['20261201000000-foundation.ts', '20261202000000-condition-checks.ts', '20261203000000-photographs.ts', '20261204000000-mark-layers.ts', '20261205000000-store-limits.ts', '20261205000100-specimen-top.ts', '20261205000200-check-corrections-index.ts', '20261206000000-comparisons.ts', '20261207000000-mail-preferences.ts', '20261208000000-treatments.ts', '20261209000000-security-log.ts']);
		const all = ['audit_events', 'auth_tokens', 'condition_checks', 'damage_terms', 'grade_intervals', 'login_throttles', 'mail_digests', 'mail_preferences', 'mark_layers', 'outgoing_mail', 'photo_comparisons', 'photo_derivatives', 'photo_fixity_checks', 'photo_uploads', 'photos', 'sign_in_devices', 'specimens', 'storage_locations', 'treatment_materials', 'treatments', 'user_sessions', 'users'];
		expect(await tables()).toEqual(all);
		expect(await migrateDownAll(sequelize)).toEqual(['20261209000000-security-log.ts', '20261208000000-treatments.ts', '20261207000000-mail-preferences.ts', '20261206000000-comparisons.ts', '20261205000200-check-corrections-index.ts', '20261205000100-specimen-top.ts', '20261205000000-store-limits.ts', '20261204000000-mark-layers.ts', '20261203000000-photographs.ts', '20261202000000-condition-checks.ts', '20261201000000-foundation.ts']);
		expect(await tables()).toEqual([]);
		await migrateUp(sequelize);
		expect(await tables()).toEqual(all);
		// A second run applies nothing.
		expect(await migrateUp(sequelize)).toEqual([]);
	});

	it('enforce the vocabularies in the database too, not only in the forms', async () => {
		await expect(
			sequelize!.query(`INSERT INTO users (email, name, role) VALUES ('x@example.org', 'X', 'superuser')`),
		).rejects.toThrow(/users_role_check/);
		await expect(
			sequelize!.query(`INSERT INTO users (email, name, role) VALUES ('Upper@Example.org', 'X', 'admin')`),
		).rejects.toThrow(/users_email_lower/);
	});

	it('refuse store limits and a specimen top that make no sense, in the database too', async () => {
		const bad = [
			[`UPDATE storage_locations SET flammable_limit_l = 0`, /storage_locations_limit_check/],
			[`UPDATE storage_locations SET near_limit_percent = 0`, /storage_locations_near_check/],
			[`UPDATE storage_locations SET temp_min_c = 30, temp_max_c = 20`, /storage_locations_temp_check/],
			[`UPDATE storage_locations SET temp_max_c = 60`, /storage_locations_temp_check/],
		] as const;
		await sequelize!.query(`INSERT INTO storage_locations (code, name) VALUES ('M-1', 'Migration bay')`);
		for (const [q, constraint] of bad) await expect(sequelize!.query(q)).rejects.toThrow(constraint);
		const [[l]] = (await sequelize!.query(`SELECT near_limit_percent, flammable_limit_l FROM storage_locations WHERE code = 'M-1'`)) as [{ near_limit_percent: number; flammable_limit_l: string | null }[], unknown];
		expect(l).toEqual({ near_limit_percent: 80, flammable_limit_l: null });
		await expect(
			sequelize!.query(
				`INSERT INTO specimens (object_number, title, preservative_kind, container_shape, inner_width_mm, inner_height_mm, container_material, closure_type, seal_type, specimen_top_mm)
				 VALUES ('M.1', 'x', 'ethanol', 'cylinder', 80, 160, 'soda-lime', 'glass-lid', 'wax', 170)`,
			),
		).rejects.toThrow(/specimens_top_check/);
	});
});
