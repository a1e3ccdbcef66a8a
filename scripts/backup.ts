// `npm run backup [-- <folder>]`: the database (pg_dump -Fc) and the uploads folder into a new
// folder (default ./backups/meniscus-<UTC time>), with a manifest of every file's SHA-256 and
// every table's rows, written last. See README.md, "Backup and restore".
import path from 'node:path';
import { parseBackupArgs } from './lib/backup/args.ts';
import { appVersion, log, mib, ROOT, runCli, seconds } from './lib/backup/cli.ts';
import { makeBackup } from './lib/backup/makeBackup.ts';
import { backupFolderName } from './lib/backup/manifest.ts';

await runCli('npm run backup [-- <new folder>]', async (data) => {
	const args = parseBackupArgs(process.argv.slice(2));
	const { url, uploadsDir } = await data();
	const dest = path.resolve(ROOT, args.folder ?? path.join('backups', backupFolderName(new Date())));
	log(`Backing up the database and ${uploadsDir} to ${dest}`);
	const { manifest, ms } = await makeBackup({ url, uploadsDir, dest, app: appVersion() }).catch((err: Error) => {
		// makeBackup fails before it writes the manifest, so what it left is recognisably unfinished.
		throw new Error(`${err.message}\nThe backup did not finish; ${dest}, if it was made, has no manifest and can be deleted.`);
	});
	const tables = Object.values(manifest.database.tables);
	const bytes = manifest.files.reduce((n, f) => n + f.size, 0);
	console.log(`Backup written to ${dest}
  database: ${tables.length} tables, ${tables.reduce((n, t) => n + t.rows, 0)} rows (PostgreSQL ${manifest.postgres.server})
  files:    ${manifest.files.length} (${mib(bytes)}, the dump included)${manifest.uploads.skipped.length ? `; ${manifest.uploads.skipped.length} deleted by the app while copying` : ''}
  took:     ${seconds(ms)}
It holds personal data: keep it somewhere only administrators can read.`);
});
