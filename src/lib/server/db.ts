import { Sequelize } from 'sequelize';
import pg from 'pg';
import { config } from './config.ts';
import { initModels } from './models/index.ts';

/**
 * The one Sequelize instance of a server process (and the pg pool Lucia's adapter uses). Created
 * on first use so that importing a module never opens a connection.
 */
let sequelize: Sequelize | undefined;
let pool: pg.Pool | undefined;

export function db(): Sequelize {
	if (!sequelize) {
		sequelize = openSequelize(config().DATABASE_URL);
		initModels(sequelize);
	}
	return sequelize;
}

export function pgPool(): pg.Pool {
	if (!pool) {
		pool = new pg.Pool({ connectionString: config().DATABASE_URL, max: 5 });
		// An idle client whose server went away emits 'error' on the pool; unheard, it would end the
		// process. The pool drops that client and opens a new one when the server is back.
		pool.on('error', (err) => console.error(`[db] idle connection lost: ${err.message}`));
	}
	return pool;
}

/** A Sequelize connection with Meniscus's settings; used by the server, migrations and tests. */
export function openSequelize(url: string): Sequelize {
	return new Sequelize(url, {
		dialect: 'postgres',
		dialectModule: pg,
		logging: false,
		pool: { max: 10, idle: 10_000 },
		define: { underscored: true },
	});
}

export async function closeDb(): Promise<void> {
	await Promise.all([sequelize?.close(), pool?.end()]);
	sequelize = undefined;
	pool = undefined;
}
