import { describe, expect, it } from 'vitest';
import { parseBackupArgs, parseRestoreArgs, UsageError } from '../../../scripts/lib/backup/args.ts';

/** The command lines of npm run backup / restore: checked before anything is read or written. */
describe('parseBackupArgs', () => {
	it('takes no folder (the default) or one', () => {
		expect(parseBackupArgs([])).toEqual({ folder: undefined });
		expect(parseBackupArgs(['/srv/backups/today'])).toEqual({ folder: '/srv/backups/today' });
	});

	it('refuses two folders, an empty one and options it does not know', () => {
		expect(() => parseBackupArgs(['a', 'b'])).toThrow(/at most one folder/);
		expect(() => parseBackupArgs(['  '])).toThrow(UsageError);
		expect(() => parseBackupArgs(['--force'])).toThrow(UsageError);
	});
});

describe('parseRestoreArgs', () => {
	it('needs exactly one backup folder; --force is off unless given', () => {
		expect(parseRestoreArgs(['backups/x'])).toEqual({ folder: 'backups/x', force: false });
		expect(parseRestoreArgs(['--force', 'backups/x'])).toEqual({ folder: 'backups/x', force: true });
		expect(() => parseRestoreArgs([])).toThrow(/exactly one backup folder/);
		expect(() => parseRestoreArgs(['a', 'b'])).toThrow(/exactly one backup folder/);
	});

	it('refuses a misspelt option rather than restoring without it', () => {
		expect(() => parseRestoreArgs(['backups/x', '--froce'])).toThrow(UsageError);
		expect(() => parseRestoreArgs(['backups/x', '--force=yes'])).toThrow(UsageError);
	});
});
