import type { CheckState } from './vocabulary.ts';

/**
 * The life of a condition check: draft → in review → approved, or returned with comments → draft
 * again. Only drafts and returned checks can be edited; an approved check never changes (a
 * correction is a new check pointing to it). Nobody approves or returns their own check. The server
 * enforces this table for every transition; the UI only hides what it refuses.
 */
export type CheckAction = 'edit' | 'submit' | 'approve' | 'return';

export interface Actor {
	id: string;
	role: 'conservator' | 'reviewer' | 'curator' | 'admin';
}

export interface CheckFacts {
	state: CheckState;
	examinerId: string;
}

export type Verdict = { ok: true; next: CheckState } | { ok: false; reason: string };

export function decideTransition(check: CheckFacts, action: CheckAction, actor: Actor): Verdict {
	const editable = check.state === 'draft' || check.state === 'returned';
	switch (action) {
		case 'edit':
		case 'submit':
			if (actor.role !== 'conservator') return { ok: false, reason: 'Only conservators write and submit condition checks.' };
			if (!editable) return { ok: false, reason: check.state === 'approved' ? 'An approved check cannot be changed; open a new check that corrects it.' : 'This check is waiting for review and cannot be changed now.' };
			// Editing a returned check makes it a draft again.
			return { ok: true, next: action === 'submit' ? 'in-review' : 'draft' };
		case 'approve':
		case 'return':
			if (actor.role !== 'reviewer') return { ok: false, reason: 'Only reviewers approve or return condition checks.' };
			if (actor.id === check.examinerId) return { ok: false, reason: 'Nobody may review their own check.' };
			if (check.state !== 'in-review') return { ok: false, reason: 'Only a check in review can be approved or returned.' };
			return { ok: true, next: action === 'approve' ? 'approved' : 'returned' };
		default:
			return { ok: false, reason: 'Unknown action.' };
	}
}
