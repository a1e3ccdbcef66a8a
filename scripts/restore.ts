// `npm run restore -- <backup folder> [--force]`: checks the backup against its manifest, restores
// the database (pg_restore, one transaction) and the uploads folder, checks the result, and says how
// long it took. See README.md, "Backup and restore".
import path from 'node:path';
import { parseRestoreArgs } from './lib/backup/args.ts';
import { log, mib, ROOT, runCli, seconds } from './lib/backup/cli.ts';
import { restoreBackup, RestoreError } from './lib/backup/restoreBackup.ts';

await runCli('npm run restore -- <backup folder> [--force]', async (data) => {
	const args = parseRestoreArgs(process.argv.slice(2));
	const { url, uploadsDir } = await data();
	const dir = path.resolve(ROOT, args.folder);
	log(`Restoring ${dir} into the database and ${uploadsDir}`);
	try {
		const r = await restoreBackup({ dir, url, uploadsDir, force: args.force });
		console.log(`Restored the backup of ${r.manifest.finishedAt} (Meniscus ${r.manifest.app.version})
  database: ${r.tables} tables, ${r.rows} rows: counts and digests match the backup
  files:    ${r.files} (${mib(r.bytes)}): every SHA-256 matches the backup${r.movedAside ? `\n  earlier uploads moved to ${r.movedAside}` : ''}
  RTO:      ${seconds(r.ms)} (verifying, restoring and checking)`);
	} catch (err) {
		if (err instanceof RestoreError && !err.changedNothing) {
			throw new Error(`${err.message}\nThe target was changed: do not start the app on it; restore again or from another backup.`);
		}
		throw err;
	}
});
