import type { Role } from '../auth/roles.ts';
import type { CheckState } from '../check/vocabulary.ts';

/**
 * Who may add photographs where. Conservators and administrators upload; a photo of a condition
 * check can be added only while that check can still be edited (a draft or a returned check), by a
 * conservator, because an approved check is evidence that never changes. A photo of the specimen
 * itself (outside any check) may be added by a conservator or an administrator.
 */
export const UPLOADER_ROLES = ['conservator', 'admin'] as const satisfies readonly Role[];
/** Roles who may download a master original (it carries the GPS position and serial numbers). */
export const ORIGINAL_ROLES = ['conservator', 'reviewer', 'admin'] as const satisfies readonly Role[];

export type UploadVerdict = { ok: true } | { ok: false; status: 403 | 404 | 409; reason: string };

export function mayUpload(role: Role, target: { specimenExists: boolean; check: { state: CheckState; specimenMatches: boolean } | null | 'missing' }): UploadVerdict {
	if (!(UPLOADER_ROLES as readonly Role[]).includes(role)) return { ok: false, status: 403, reason: 'Only conservators and administrators add photographs.' };
	if (!target.specimenExists) return { ok: false, status: 404, reason: 'No such specimen.' };
	if (target.check === null) return { ok: true };
	if (target.check === 'missing') return { ok: false, status: 404, reason: 'No such condition check.' };
	if (!target.check.specimenMatches) return { ok: false, status: 409, reason: 'That condition check belongs to another specimen.' };
	if (role !== 'conservator') return { ok: false, status: 403, reason: 'Only conservators add photographs to a condition check.' };
	return checkTakesPhotos(target.check.state);
}

/**
 * Whether a check in this state still takes photographs: asked when an upload is created, before
 * each later PATCH, and when its last byte is in, because a check can be submitted or approved
 * while a large photo of it is still on its way (`null`: the check no longer exists).
 */
export function checkTakesPhotos(state: CheckState | null): UploadVerdict {
	if (state === null) return { ok: false, status: 404, reason: 'No such condition check.' };
	if (state === 'approved') return { ok: false, status: 409, reason: 'This check is approved and cannot change; open a new check to add photographs.' };
	if (state === 'in-review') return { ok: false, status: 409, reason: 'This check is waiting for review; photographs can be added once it is returned, or to a new check.' };
	return { ok: true };
}

export const mayDownloadOriginal = (role: Role) => (ORIGINAL_ROLES as readonly Role[]).includes(role);
