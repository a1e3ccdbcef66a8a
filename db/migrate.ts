import { Umzug, SequelizeStorage } from 'umzug';
import type { QueryInterface, Sequelize } from 'sequelize';
import { MIGRATIONS } from './migrations/index.ts';

/**
 * The migration runner (umzug, Sequelize's own). Migrations are TypeScript files in
 * db/migrations named YYYYMMDDHHmmss-name.ts, each exporting `up` and `down`, listed in
 * db/migrations/index.ts; applied ones are recorded in the table `schema_migrations`.
 */

export function migrator(sequelize: Sequelize) {
	return new Umzug({
		migrations: MIGRATIONS.map((m) => ({
			name: m.name,
			up: ({ context }: { context: QueryInterface }) => m.up({ name: m.name, context }),
			down: ({ context }: { context: QueryInterface }) => m.down({ name: m.name, context }),
		})),
		context: sequelize.getQueryInterface(),
		storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
		logger: undefined,
	});
}

export async function migrateUp(sequelize: Sequelize): Promise<string[]> {
	const done = await migrator(sequelize).up();
	return done.map((m) => m.name);
}

export async function migrateDownAll(sequelize: Sequelize): Promise<string[]> {
	const done = await migrator(sequelize).down({ to: 0 });
	return done.map((m) => m.name);
}
