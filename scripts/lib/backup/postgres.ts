import { execFile } from 'node:child_process';
import path from 'node:path';
import { promisify } from 'node:util';
import pg from 'pg';
import { findPgBin } from '../../../db/cluster.mjs';
import type { TableDigests } from './manifest.ts';

/**
 * The database side of backup and restore: Debian's pg_dump and pg_restore (found where
 * db/cluster.mjs finds the server), and the row counts and content digests that prove a restore.
 */
export class PgToolError extends Error {
	override name = 'PgToolError';
}

/**
 * A tool's connection: the URL without its password on the command line (where `ps` would show
 * it), the password in PGPASSWORD. Inherited PG* variables are dropped as db/cluster.mjs does,
 * since PGHOST or PGDATABASE would silently change what the tool reaches.
 */
function connection(url: string): { dbname: string; env: NodeJS.ProcessEnv } {
	const u = new URL(url);
	const password = decodeURIComponent(u.password);
	u.password = '';
	const env = Object.fromEntries(Object.entries(process.env).filter(([k]) => !k.startsWith('PG')));
	return { dbname: u.toString(), env: { ...env, PGPASSWORD: password, PGCONNECT_TIMEOUT: '10' } };
}

async function runTool(name: 'pg_dump' | 'pg_restore', args: string[], url?: string): Promise<string> {
	const file = path.join(await findPgBin(), name);
	const conn = url ? connection(url) : undefined;
	try {
		const { stdout } = await promisify(execFile)(file, conn ? [...args, `--dbname=${conn.dbname}`] : args, {
			env: conn?.env ?? process.env,
			maxBuffer: 16 * 1024 * 1024,
		});
		return stdout;
	} catch (err) {
		const e = err as Error & { stderr?: string; code?: number };
		const detail = (e.stderr ?? e.message).trim().split('\n').slice(-15).join('\n');
		throw new PgToolError(`${name} failed (exit ${e.code ?? '?'}):\n${detail}`);
	}
}

export const pgDumpVersion = async () => (await runTool('pg_dump', ['--version'])).trim();

/**
 * `pg_dump -Fc` of the snapshot another session exported, so the dump holds exactly the rows
 * counted there. pg_dump fsyncs its output before it exits unless told --no-sync (PostgreSQL docs,
 * app-pgdump).
 */
export async function dumpDatabase(url: string, file: string, snapshot: string): Promise<void> {
	await runTool('pg_dump', ['--format=custom', `--snapshot=${snapshot}`, `--file=${file}`], url);
}

/**
 * pg_restore in one transaction that stops at the first error, so a failed restore leaves the
 * target as it was (PostgreSQL docs, app-pgrestore: --single-transaction implies --exit-on-error,
 * which is spelled out anyway). --no-owner: the restored objects belong to the user restoring them,
 * the one the app connects as. Not --clean: it cannot drop pg-boss's partitioned tables ("cannot
 * drop inherited constraint"), so a forced restore moves the old schemas aside first (schemas.ts).
 */
export async function restoreDatabase(url: string, file: string): Promise<void> {
	await runTool('pg_restore', ['--exit-on-error', '--single-transaction', '--no-owner', file], url);
}

export const quoteIdent = (s: string) => `"${s.replace(/"/g, '""')}"`;

/** Ordinary and partitioned tables outside PostgreSQL's own schemas (pg-boss keeps its own schema). */
export async function listTables(client: pg.ClientBase, skipSchemas: string[] = []): Promise<{ schema: string; name: string }[]> {
	const { rows } = await client.query<{ schema: string; name: string }>(
		`SELECT n.nspname AS schema, c.relname AS name
		 FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
		 WHERE c.relkind IN ('r', 'p') AND n.nspname <> 'information_schema' AND n.nspname NOT LIKE 'pg\\_%' AND NOT n.nspname = ANY($1)
		 ORDER BY 1, 2`,
		[skipSchemas],
	);
	return rows;
}

/**
 * Text output of dates, intervals, floats and bytea depends on session settings; these fix them,
 * so the same rows give the same digest on any server and client.
 */
async function fixTextOutput(client: pg.ClientBase): Promise<void> {
	await client.query(`SELECT set_config('TimeZone', 'UTC', true), set_config('DateStyle', 'ISO, YMD', true),
		set_config('IntervalStyle', 'postgres', true), set_config('extra_float_digits', '1', true), set_config('bytea_output', 'hex', true)`);
}

/**
 * Each table's row count and an md5 over its rows: the md5 of every row's text, sorted and joined,
 * then hashed. Sorting by the row hash (in byte order) needs no primary key and no collation, so
 * tables without one, and servers with another locale, give the same digest for the same rows.
 * Must run inside a transaction (the settings are local to it).
 */
export async function tableDigests(client: pg.ClientBase, skipSchemas: string[] = []): Promise<TableDigests> {
	await fixTextOutput(client);
	const out: TableDigests = {};
	for (const t of await listTables(client, skipSchemas)) {
		const { rows } = await client.query<{ rows: string; md5: string }>(
			`SELECT count(*) AS rows, md5(coalesce(string_agg(h, '' ORDER BY h COLLATE "C"), '')) AS md5
			 FROM (SELECT md5(r::text) AS h FROM ${quoteIdent(t.schema)}.${quoteIdent(t.name)} r) hashed`,
		);
		out[`${t.schema}.${t.name}`] = { rows: Number(rows[0]!.rows), md5: rows[0]!.md5 };
	}
	return out;
}

/** Runs `work` in a transaction on a client of its own, always closing it. */
export async function withTransaction<T>(url: string, isolation: string, work: (client: pg.Client) => Promise<T>): Promise<T> {
	const client = new pg.Client({ connectionString: url });
	await client.connect();
	try {
		await client.query(`BEGIN ISOLATION LEVEL ${isolation}`);
		const result = await work(client);
		await client.query('COMMIT');
		return result;
	} catch (err) {
		await client.query('ROLLBACK').catch(() => {});
		throw err;
	} finally {
		await client.end();
	}
}

/** A database's digests and server version, read in one snapshot (schemas moved aside left out). */
export async function readDatabase(url: string, skipSchemas: string[] = []): Promise<{ tables: TableDigests; server: string; name: string }> {
	return withTransaction(url, 'REPEATABLE READ READ ONLY', async (client) => describeSnapshot(client, skipSchemas));
}

export async function describeSnapshot(client: pg.ClientBase, skipSchemas: string[] = []): Promise<{ tables: TableDigests; server: string; name: string }> {
	const { rows } = await client.query<{ server: string; name: string }>(`SELECT current_setting('server_version') AS server, current_database() AS name`);
	return { tables: await tableDigests(client, skipSchemas), server: rows[0]!.server, name: rows[0]!.name };
}
