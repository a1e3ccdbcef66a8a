import fsp from 'node:fs/promises';
import { QueryTypes } from 'sequelize';
import { db } from '../db.ts';
import { audit } from '../audit.ts';
import { resolveStored, sha256File } from './storage.ts';

/**
 * Fixity checks: the worker re-hashes the masters on a rolling schedule and records each result, so
 * a file altered or lost on disk (a failing disk, a careless restore, tampering) is found and shown
 * rather than trusted. Each pass takes the photos checked longest ago (never-checked first), up to
 * a byte budget, so the work is spread out instead of re-reading the whole store at once.
 */
export type FixityOutcome = 'match' | 'mismatch' | 'missing';

export interface FixityReport {
	checked: number;
	bytes: number;
	problems: { photoId: string; outcome: FixityOutcome }[];
}

export async function fixityPass(opts: { olderThanDays: number; byteBudget: number; now?: Date }): Promise<FixityReport> {
	const now = opts.now ?? new Date();
	const due = await db().query<{ id: string; sha256: string; master_path: string; byte_size: string }>(
		`SELECT p.id, p.sha256, p.master_path, p.byte_size
		 FROM photos p
		 LEFT JOIN LATERAL (SELECT max(checked_at) AS last FROM photo_fixity_checks f WHERE f.photo_id = p.id) f ON true
		 WHERE f.last IS NULL OR f.last < :cutoff
		 ORDER BY f.last ASC NULLS FIRST, p.created_at ASC
		 LIMIT 1000`,
		{ replacements: { cutoff: new Date(now.getTime() - opts.olderThanDays * 86_400_000) }, type: QueryTypes.SELECT },
	);
	const report: FixityReport = { checked: 0, bytes: 0, problems: [] };
	for (const p of due) {
		if (report.checked > 0 && report.bytes + Number(p.byte_size) > opts.byteBudget) break;
		const { outcome, seen, detail } = await checkOne(p.master_path, p.sha256);
		await db().query(`INSERT INTO photo_fixity_checks (photo_id, checked_at, outcome, sha256_seen, detail) VALUES (:id, :at, :outcome, :seen, :detail)`, {
			replacements: { id: p.id, at: now, outcome, seen, detail },
		});
		if (outcome !== 'match') {
			report.problems.push({ photoId: p.id, outcome });
			await audit({ action: `photo.fixity-${outcome}`, entityType: 'photo', entityId: p.id, after: { expected: p.sha256, seen, detail } });
		}
		report.checked++;
		report.bytes += Number(p.byte_size);
	}
	return report;
}

async function checkOne(masterPath: string, expected: string): Promise<{ outcome: FixityOutcome; seen: string | null; detail: string | null }> {
	const file = resolveStored(masterPath);
	try {
		await fsp.access(file);
	} catch {
		return { outcome: 'missing', seen: null, detail: `The master ${masterPath} is not on disk.` };
	}
	const seen = await sha256File(file);
	return seen === expected ? { outcome: 'match', seen, detail: null } : { outcome: 'mismatch', seen, detail: 'The master on disk no longer hashes to the SHA-256 recorded when it was uploaded.' };
}

/** The latest fixity check of a photo, for its page. */
export async function lastFixity(photoId: string): Promise<{ checkedAt: string; outcome: FixityOutcome } | null> {
	const [row] = await db().query<{ checked_at: Date; outcome: FixityOutcome }>(
		`SELECT checked_at, outcome FROM photo_fixity_checks WHERE photo_id = :photoId ORDER BY checked_at DESC LIMIT 1`,
		{ replacements: { photoId }, type: QueryTypes.SELECT },
	);
	return row ? { checkedAt: new Date(row.checked_at).toISOString(), outcome: row.outcome } : null;
}
