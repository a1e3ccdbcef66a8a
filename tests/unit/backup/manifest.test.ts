import { describe, expect, it } from 'vitest';
import { backupFolderName, buildManifest, FORMAT, ManifestError, parseManifest, uploadEntries, type Manifest } from '../../../scripts/lib/backup/manifest.ts';

/**
 * The backup manifest (TESTPLAN D6; ASVS 4.0.3 8.1.6: backups are checked before they are trusted).
 * Hashes are SHA-256 as FIPS 180-4 defines it; the one used here is the standard's "abc" example.
 */
const ABC = 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad';
const MD5_EMPTY = 'd41d8cd98f00b204e9800998ecf8427e'; // RFC 1321, MD5("")

function manifest(over: Partial<Manifest> = {}): Manifest {
	return {
		format: FORMAT,
		version: 1,
		startedAt: '2026-12-02T06:00:00.000Z',
		finishedAt: '2026-12-02T06:00:05.000Z',
		app: { name: 'meniscus', version: '0.1.0' },
		postgres: { server: '15.18', pgDump: 'pg_dump (PostgreSQL) 15.18' },
		database: { name: 'meniscus', dump: 'database.dump', tables: { 'public.users': { rows: 4, md5: MD5_EMPTY }, 'pgboss.job': { rows: 0, md5: MD5_EMPTY } } },
		uploads: { source: '/srv/meniscus/uploads', skipped: [] },
		files: [
			{ path: 'uploads/masters/ab/x.jpg', size: 3, sha256: ABC },
			{ path: 'database.dump', size: 3, sha256: ABC },
		],
		...over,
	};
}

describe('buildManifest', () => {
	it('sorts files by path and tables by name, so two backups of the same data differ only in their times', () => {
		const m = buildManifest(manifest());
		expect(m.files.map((f) => f.path)).toEqual(['database.dump', 'uploads/masters/ab/x.jpg']);
		expect(Object.keys(m.database.tables)).toEqual(['pgboss.job', 'public.users']);
	});

	it('refuses a file listed twice and a manifest without the dump', () => {
		const twice = manifest({ files: [...manifest().files, { path: 'database.dump', size: 3, sha256: ABC }] });
		expect(() => buildManifest(twice)).toThrow(/database.dump is listed twice/);
		expect(() => buildManifest(manifest({ files: [{ path: 'uploads/a', size: 3, sha256: ABC }] }))).toThrow(ManifestError);
	});

	it('refuses a hash that is not 64 lowercase hex digits', () => {
		expect(() => buildManifest(manifest({ files: [{ path: 'database.dump', size: 3, sha256: ABC.toUpperCase() }] }))).toThrow(/64 lowercase hex/);
	});
});

describe('parseManifest', () => {
	it('reads back what buildManifest wrote', () => {
		const m = buildManifest(manifest());
		expect(parseManifest(JSON.stringify(m))).toEqual(m);
	});

	it('says so when the text is not JSON (a manifest cut short)', () => {
		expect(() => parseManifest('{"format": "meniscus-')).toThrow(/not valid JSON/);
	});

	it('names the field that is wrong', () => {
		expect(() => parseManifest(JSON.stringify({ ...manifest(), format: 'other' }))).toThrow(/format/);
		expect(() => parseManifest(JSON.stringify({ ...manifest(), version: 2 }))).toThrow(/version/);
	});

	it.each(['../etc/passwd', '/etc/passwd', 'uploads/../../x', 'uploads//x', 'uploads\\x', './database.dump'])(
		'refuses the path %s, which would leave the backup folder or name one file two ways',
		(p) => {
			expect(() => parseManifest(JSON.stringify(manifest({ files: [{ path: p, size: 1, sha256: ABC }] })))).toThrow(/inside the backup folder/);
		},
	);
});

describe('uploadEntries', () => {
	it('gives the uploaded files relative to the uploads folder, without the dump', () => {
		expect(uploadEntries(manifest())).toEqual([{ path: 'masters/ab/x.jpg', size: 3, sha256: ABC }]);
	});
});

describe('backupFolderName', () => {
	it('is the UTC time, sortable and without colons', () => {
		expect(backupFolderName(new Date('2026-12-02T06:43:02.802Z'))).toBe('meniscus-20261202T064302Z');
	});
});
