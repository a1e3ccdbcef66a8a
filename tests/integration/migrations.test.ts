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
		expect(await migrateUp(sequelize)).toEqual(['20261201000000-foundation.ts', '20261202000000-condition-checks.ts', '20261203000000-photographs.ts', '20261204000000-mark-layers.ts', '20261206000000-comparisons.ts']);
		const all = ['audit_events', 'auth_tokens', 'condition_checks', 'damage_terms', 'grade_intervals', 'login_throttles', 'mark_layers', 'outgoing_mail', 'photo_comparisons', 'photo_derivatives', 'photo_fixity_checks', 'photo_uploads', 'photos', 'specimens', 'storage_locations', 'user_sessions', 'users'];
		expect(await tables()).toEqual(all);
		expect(await migrateDownAll(sequelize)).toEqual(['20261206000000-comparisons.ts', '20261204000000-mark-layers.ts', '20261203000000-photographs.ts', '20261202000000-condition-checks.ts', '20261201000000-foundation.ts']);
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
});
