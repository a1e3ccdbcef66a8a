import { describe, expect, it } from 'vitest';
import { isWithin } from '../../../scripts/lib/backup/files.ts';

/** Where a backup may go: never inside the uploads folder it copies (it would copy itself). */
describe('isWithin', () => {
	it('holds for the folder itself and anything below it', () => {
		expect(isWithin('/srv/uploads', '/srv/uploads')).toBe(true);
		expect(isWithin('/srv/uploads', '/srv/uploads/backups/x')).toBe(true);
		expect(isWithin('/srv/uploads', '/srv/uploads/..odd-name')).toBe(true);
	});

	it('does not hold for a sibling whose name only starts the same, or a folder above', () => {
		expect(isWithin('/srv/uploads', '/srv/uploads-backups/x')).toBe(false);
		expect(isWithin('/srv/uploads', '/srv')).toBe(false);
		expect(isWithin('/srv/uploads', '/srv/..uploads')).toBe(false);
	});
});
