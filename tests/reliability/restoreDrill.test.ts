import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { createDatabase, freePort, removeCluster, startCluster } from '../../db/cluster.mjs';
import { compareFiles, compareTables } from '../../scripts/lib/backup/compare.ts';
import { hashTree, listFiles } from '../../scripts/lib/backup/files.ts';
import { MANIFEST_NAME, parseManifest, uploadEntries, type Manifest } from '../../scripts/lib/backup/manifest.ts';
import { listTables, readDatabase, tableDigests } from '../../scripts/lib/backup/postgres.ts';
import { sha256File } from '../../src/lib/server/photos/storage.ts';
import { findOrphans, type DerivativeRow, type PhotoRow } from '../helpers/orphans.ts';

/**
 * TESTPLAN D6, the restore drill (ASVS 4.0.3 8.1.5–8.1.6: backups are made, and restoring them is
 * tested): `npm run backup` of the test database and uploads (pg_dump -Fc, a consistent snapshot,
 * PostgreSQL docs app-pgdump), `npm run restore` into a fresh cluster and a fresh uploads folder
 * (pg_restore --exit-on-error --single-transaction, app-pgrestore), then every table's rows and
 * content digest, every file's hash and 0 orphans, each shown to fail when the data is tampered with.
 *
 * The app server and the photo worker keep running against the source (pg-boss, the reconciler,
 * fixity checks write all the time), so the source side of every comparison is the manifest: its
 * counts and digests were read in the very snapshot pg_dump wrote. Masters never change once
 * recorded, so those are also compared with the live source files.
 */
const root = path.resolve(import.meta.dirname, '..', '..');
const tsx = path.join(root, 'node_modules', '.bin', 'tsx');

function cli(script: 'backup.ts' | 'restore.ts', args: string[], env: { DATABASE_URL: string; MENISCUS_UPLOADS_DIR: string }) {
	const started = Date.now();
	const r = spawnSync(tsx, [path.join('scripts', script), ...args], { cwd: root, env: { ...process.env, ...env }, encoding: 'utf8' });
	return { status: r.status, stdout: r.stdout, stderr: r.stderr, ms: Date.now() - started };
}

async function withClient<T>(url: string, work: (c: pg.Client) => Promise<T>): Promise<T> {
	const client = new pg.Client({ connectionString: url });
	await client.connect();
	try {
		return await work(client);
	} finally {
		await client.end();
	}
}

const dbUrl = (url: string, name: string) => url.replace(/\/[^/]+$/, `/${name}`);

// A drill's time grows with the store it copies: after the L2 file's thirty 60-MP photographs (about
// 1.2 GiB) a backup took about 60 s and a restore about 45 s here, so each step may take minutes.
describe('D6 restore drill: backup, restore into a fresh cluster, prove it', { timeout: 600_000 }, () => {
	const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'bk-drill-'));
	const dataDir = path.join(tmp, 'pg', 'data');
	const backupDir = path.join(tmp, 'backups', 'drill');
	const restoredUploads = path.join(tmp, 'uploads-restored');
	const source = { DATABASE_URL: inject('databaseUrl'), MENISCUS_UPLOADS_DIR: inject('uploadsDir') };
	let restoredUrl = '';
	let port = 0;
	let manifest: Manifest;
	let restoreRun: ReturnType<typeof cli>;

	beforeAll(async () => {
		// As root the postgres OS user must enter the folder (mkdtemp makes it 0700).
		fs.chmodSync(tmp, 0o755);
		const backup = cli('backup.ts', [backupDir], source);
		expect(backup.stderr + backup.stdout).toContain('Backup written to');
		expect(backup.status).toBe(0);
		manifest = parseManifest(fs.readFileSync(path.join(backupDir, MANIFEST_NAME), 'utf8'));
		port = await freePort();
		restoredUrl = (await startCluster({ dataDir, port, log: () => {}, database: 'meniscus_restored' })).url;
		// An uploads folder as a fresh clone has it: only git's placeholder, which counts as empty.
		fs.mkdirSync(restoredUploads);
		fs.writeFileSync(path.join(restoredUploads, '.gitkeep'), '');
		restoreRun = cli('restore.ts', [backupDir], { DATABASE_URL: restoredUrl, MENISCUS_UPLOADS_DIR: restoredUploads });
		const bytes = manifest.files.reduce((n, f) => n + f.size, 0);
		const dump = manifest.files.find((f) => f.path === 'database.dump')!;
		console.log(`[D6] backup ${backup.ms} ms, restore ${restoreRun.ms} ms (both with tsx start-up); ${manifest.files.length} files, ` +
			`${(bytes / 1048576).toFixed(1)} MiB, dump ${(dump.size / 1024).toFixed(0)} KiB\n${restoreRun.stdout}`);
	}, 600_000);

	afterAll(async () => {
		await removeCluster({ dataDir }).catch(() => {});
		fs.rmSync(tmp, { recursive: true, force: true });
	});

	// ASVS 4.0.3 8.1.5 (backups of important data are made): the whole database, pg-boss's queue included, and every photo file.
	it('backs up every table of the snapshot and the photo files', () => {
		const tables = manifest.database.tables;
		expect(Object.keys(tables)).toEqual(expect.arrayContaining(['public.specimens', 'public.photos', 'public.photo_derivatives', 'public.users']));
		expect(Object.keys(tables).some((t) => t.startsWith('pgboss.'))).toBe(true);
		expect(tables['public.specimens']!.rows).toBeGreaterThanOrEqual(30);
		expect(tables['public.photos']!.rows).toBeGreaterThan(0);
		expect(uploadEntries(manifest).filter((f) => f.path.startsWith('masters/')).length).toBeGreaterThanOrEqual(tables['public.photos']!.rows);
	});

	// TESTPLAN D6: RTO measured.
	it('restores with exit 0 and reports its recovery time', () => {
		expect(restoreRun.stderr).not.toContain('error:');
		expect(restoreRun.status).toBe(0);
		expect(restoreRun.stdout).toMatch(/RTO: +\d+\.\d s/);
	});

	// TESTPLAN D6 "counts … match"; ASVS 4.0.3 8.1.5 (test restoration). The manifest's side was read in the snapshot pg_dump wrote (app-pgdump, --snapshot).
	it('restores every table with the row count and content digest of the backed-up snapshot', async () => {
		// Listed and counted here with plain SQL of its own, apart from the scripts' listing.
		const counted = await withClient(restoredUrl, async (c) => {
			const { rows } = await c.query<{ t: string }>(
				`SELECT format('%s.%s', schemaname, tablename) AS t FROM pg_tables WHERE schemaname NOT IN ('pg_catalog', 'information_schema') ORDER BY 1`,
			);
			const out: Record<string, number> = {};
			for (const { t } of rows) {
				const [schema, name] = t.split('.');
				out[t] = Number((await c.query(`SELECT count(*) AS n FROM ${c.escapeIdentifier(schema!)}.${c.escapeIdentifier(name!)}`)).rows[0].n);
			}
			return out;
		});
		expect(counted).toEqual(Object.fromEntries(Object.entries(manifest.database.tables).map(([t, e]) => [t, e.rows])));
		const restored = await readDatabase(restoredUrl);
		expect(compareTables(manifest.database.tables, restored.tables)).toEqual([]);
	});

	it('sees a single changed row as a digest mismatch of its table (the check can fail)', async () => {
		await withClient(restoredUrl, async (c) => {
			await c.query('BEGIN');
			try {
				await c.query(`UPDATE specimens SET title = title || '.' WHERE id = (SELECT min(id::text)::uuid FROM specimens)`);
				const wrong = compareTables(manifest.database.tables, await tableDigests(c));
				expect(wrong).toContainEqual(expect.objectContaining({ kind: 'table', path: 'public.specimens', problem: 'md5' }));
			} finally {
				await c.query('ROLLBACK');
			}
		});
	});

	// TESTPLAN D6 "hashes match".
	it('restores every file byte for byte, each master matching the hash recorded at ingest', async () => {
		expect(compareFiles(uploadEntries(manifest), await hashTree(restoredUploads))).toEqual([]);
		const photos = await withClient(restoredUrl, async (c) => (await c.query<{ master_path: string; sha256: string }>('SELECT master_path, sha256 FROM photos')).rows);
		expect(photos.length).toBe(manifest.database.tables['public.photos']!.rows);
		for (const p of photos) {
			const restored = await sha256File(path.join(restoredUploads, p.master_path));
			expect(restored, p.master_path).toBe(p.sha256);
			// Masters never change once recorded, so the live source must still hold the same bytes.
			expect(await sha256File(path.join(source.MENISCUS_UPLOADS_DIR, p.master_path)), p.master_path).toBe(restored);
		}
	});

	// TESTPLAN D6 "0 orphans".
	it('leaves 0 orphans: every photo has its files, every photo file has its photo', async () => {
		const rows = await withClient(restoredUrl, async (c) => ({
			photos: (await c.query<PhotoRow>(`SELECT id, master_path AS "masterPath", derivative_set AS "derivativeSet" FROM photos`)).rows,
			derivatives: (await c.query<DerivativeRow>(`SELECT photo_id AS "photoId", set_id AS "setId", kind, path FROM photo_derivatives`)).rows,
		}));
		const files = await listFiles(restoredUploads);
		expect(rows.derivatives.length).toBeGreaterThanOrEqual(rows.photos.length * 3);
		expect(findOrphans(rows.photos, rows.derivatives, files)).toEqual({ missing: [], unowned: [] });
		// The same check on a tampered listing: one master gone, one stray file.
		const gone = rows.photos[0]!.masterPath;
		const tampered = [...files.filter((f) => f !== gone), 'masters/zz/stray.jpg'];
		expect(findOrphans(rows.photos, rows.derivatives, tampered)).toEqual({ missing: [gone], unowned: ['masters/zz/stray.jpg'] });
	});

	// ASVS 4.0.3 8.1.6 (backups protected from corruption): a corrupted backup is never restored.
	it('refuses a backup with one changed byte before changing anything', async () => {
		const tampered = path.join(tmp, 'backups', 'tampered');
		fs.cpSync(backupDir, tampered, { recursive: true });
		const master = uploadEntries(manifest).find((f) => f.path.startsWith('masters/'))!.path;
		const file = path.join(tampered, 'uploads', master);
		const bytes = fs.readFileSync(file);
		const at = bytes.length >> 1;
		bytes[at] = bytes[at]! ^ 0x01; // same size, one bit different
		fs.writeFileSync(file, bytes);
		await createDatabase({ dataDir, port, name: 'meniscus_tampered' });
		const url = dbUrl(restoredUrl, 'meniscus_tampered');
		const uploads = path.join(tmp, 'uploads-tampered');
		const r = cli('restore.ts', [tampered], { DATABASE_URL: url, MENISCUS_UPLOADS_DIR: uploads });
		expect(r.status).toBe(1);
		expect(r.stderr).toContain('does not match its manifest; nothing was changed');
		expect(r.stderr).toContain(`file uploads/${master} has another SHA-256`);
		expect(await withClient(url, (c) => listTables(c))).toEqual([]);
		expect(fs.existsSync(uploads)).toBe(false);
	});

	it('refuses a half-made backup (no manifest) and an unknown option', () => {
		const half = path.join(tmp, 'backups', 'half');
		fs.cpSync(backupDir, half, { recursive: true });
		fs.rmSync(path.join(half, MANIFEST_NAME));
		const env = { DATABASE_URL: dbUrl(restoredUrl, 'meniscus_tampered'), MENISCUS_UPLOADS_DIR: path.join(tmp, 'uploads-half') };
		const r = cli('restore.ts', [half], env);
		expect(r.status).toBe(1);
		expect(r.stderr).toContain('has no manifest.json');
		const bad = cli('restore.ts', [backupDir, '--froce'], env);
		expect(bad.status).toBe(2);
		expect(bad.stderr).toContain('usage: npm run restore');
	});

	// PostgreSQL docs app-pgrestore: --single-transaction, with --exit-on-error, restores all or nothing.
	it('rolls a forced restore back when pg_restore fails, and puts the earlier data back', async () => {
		const broken = path.join(tmp, 'backups', 'broken-dump');
		fs.cpSync(backupDir, broken, { recursive: true });
		const dump = path.join(broken, 'database.dump');
		fs.truncateSync(dump, Math.floor(fs.statSync(dump).size / 2));
		// The manifest made to agree, as if the dump had been cut short when it was written: only pg_restore can tell.
		const files = await Promise.all(manifest.files.map(async (f) => (f.path === 'database.dump' ? { ...f, size: fs.statSync(dump).size, sha256: await sha256File(dump) } : f)));
		fs.writeFileSync(path.join(broken, MANIFEST_NAME), JSON.stringify({ ...manifest, files }));
		const filesBefore = await hashTree(restoredUploads);
		const r = cli('restore.ts', [broken, '--force'], { DATABASE_URL: restoredUrl, MENISCUS_UPLOADS_DIR: restoredUploads });
		expect(r.status).toBe(1);
		expect(r.stderr).toContain('pg_restore failed');
		expect(r.stderr).toContain('The restore was rolled back; nothing was changed.');
		// Everything as the first restore left it, and no schema left over from moving the old ones aside.
		expect(compareTables(manifest.database.tables, (await readDatabase(restoredUrl)).tables)).toEqual([]);
		expect(compareFiles(filesBefore, await hashTree(restoredUploads))).toEqual([]);
	});

	it('refuses a non-empty target unless --force, which replaces it and keeps the old files aside', async () => {
		const env = { DATABASE_URL: restoredUrl, MENISCUS_UPLOADS_DIR: restoredUploads };
		const refused = cli('restore.ts', [backupDir], env);
		expect(refused.status).toBe(1);
		expect(refused.stderr).toContain('The target is not empty');
		const forced = cli('restore.ts', [backupDir, '--force'], env);
		expect(forced.stderr).not.toContain('error:');
		expect(forced.status).toBe(0);
		expect(forced.stdout).toContain('earlier uploads moved to');
		// Read without leaving anything out: the old schemas moved aside must be gone again.
		expect(compareTables(manifest.database.tables, (await readDatabase(restoredUrl)).tables)).toEqual([]);
		expect(compareFiles(uploadEntries(manifest), await hashTree(restoredUploads))).toEqual([]);
		expect(fs.readdirSync(tmp).filter((n) => n.startsWith('uploads-restored.before-restore-'))).toHaveLength(1);
	});
});
