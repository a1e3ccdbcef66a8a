import { quoteIdent, withTransaction } from './postgres.ts';

/**
 * A forced restore over a database that already has data: its schemas are renamed aside (one
 * transaction) and an empty public schema made, pg_restore fills that, and the old schemas are
 * dropped only once the restored data has been proven; if pg_restore fails they are put back.
 * Renaming, not dropping, so a failure never leaves the target with neither the old data nor
 * the new.
 */
export interface MovedSchema {
	from: string;
	to: string;
}

const USER_SCHEMAS = `SELECT nspname AS name FROM pg_namespace WHERE nspname <> 'information_schema' AND nspname NOT LIKE 'pg\\_%' ORDER BY 1`;

/** `stamp` makes the aside names unique, e.g. public → public_before_20261202064308. */
export async function moveSchemasAside(url: string, stamp: string): Promise<MovedSchema[]> {
	return withTransaction(url, 'READ COMMITTED', async (c) => {
		const moved = (await c.query<{ name: string }>(USER_SCHEMAS)).rows.map(({ name }) => ({ from: name, to: `${name}_before_${stamp}` }));
		// PostgreSQL cuts longer names to 63 bytes, which could give two schemas one name.
		const tooLong = moved.find((m) => Buffer.byteLength(m.to) > 63);
		if (tooLong) throw new Error(`Schema ${tooLong.from} has too long a name to move aside; drop it by hand first.`);
		for (const m of moved) await c.query(`ALTER SCHEMA ${quoteIdent(m.from)} RENAME TO ${quoteIdent(m.to)}`);
		await c.query('CREATE SCHEMA public');
		return moved;
	});
}

/** After a failed pg_restore (which changed nothing): the empty public schema goes, the old names come back. */
export async function putSchemasBack(url: string, moved: MovedSchema[]): Promise<void> {
	await withTransaction(url, 'READ COMMITTED', async (c) => {
		await c.query('DROP SCHEMA public');
		for (const m of moved) await c.query(`ALTER SCHEMA ${quoteIdent(m.to)} RENAME TO ${quoteIdent(m.from)}`);
	});
}

export async function dropSchemas(url: string, moved: MovedSchema[]): Promise<void> {
	await withTransaction(url, 'READ COMMITTED', async (c) => {
		for (const m of moved) await c.query(`DROP SCHEMA ${quoteIdent(m.to)} CASCADE`);
	});
}
