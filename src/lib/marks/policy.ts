import type { Role } from '../auth/roles.ts';
import type { CheckState, Part } from '../check/vocabulary.ts';
import { isDamage, type Mark, type MarkLayer, type Point } from './schema.ts';
import { validOutline } from './geometry.ts';

/**
 * Who may change what in a photo's mark layer. Conservators map damage while the photo's check can
 * still be edited (or on a photo of the specimen outside any check); reviewers pin comments to marks
 * but never change them; curators and administrators read. Once the check is approved nothing
 * changes (the database refuses it too). A save replaces the whole layer, so the server compares
 * it with what is stored: authorship cannot be rewritten and other people's comments stay.
 */
export type LayerMode = 'edit' | 'comment' | 'read';

export function layerMode(role: Role, checkState: CheckState | null): { mode: LayerMode; reason: string | null } {
	if (checkState === 'approved') return { mode: 'read', reason: 'The check is approved; its photographs and their marks no longer change.' };
	if (role === 'conservator') {
		if (checkState === 'in-review') return { mode: 'read', reason: 'The check is waiting for review; marks can be changed once it is returned.' };
		return { mode: 'edit', reason: null };
	}
	if (role === 'reviewer') return { mode: 'comment', reason: 'Reviewers comment on marks; conservators draw them.' };
	return { mode: 'read', reason: 'Marks are drawn by conservators; this view is read-only.' };
}

export type ChangeVerdict = { ok: true } | { ok: false; status: 400 | 403; reason: string };

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);
const byId = <T extends { id: string }>(xs: T[]) => new Map(xs.map((x) => [x.id, x]));

export function checkLayerChange(before: MarkLayer, after: MarkLayer, actor: { id: string; mode: LayerMode }): ChangeVerdict {
	if (actor.mode === 'read') return { ok: false, status: 403, reason: 'You may read these marks but not change them.' };
	const oldMarks = byId(before.marks);
	if (actor.mode === 'comment' && (before.marks.length !== after.marks.length || after.marks.some((m) => !same(m, oldMarks.get(m.id))))) {
		return { ok: false, status: 403, reason: 'Reviewers may add comments to marks but not change the marks.' };
	}
	for (const m of after.marks) {
		const old = oldMarks.get(m.id);
		if (!old && m.authorId !== actor.id) return { ok: false, status: 400, reason: `A new mark (${m.id}) must name you as its author.` };
		if (old && (old.authorId !== m.authorId || old.createdAt !== m.createdAt)) return { ok: false, status: 400, reason: `The author and creation time of mark ${m.id} cannot be changed.` };
	}
	const kept = new Set(after.marks.map((m) => m.id));
	const newComments = byId(after.comments);
	for (const c of before.comments) {
		const now = newComments.get(c.id);
		// A comment goes with its mark; otherwise only its author may take it back, and nobody may reword it.
		if (!now && kept.has(c.markId) && c.authorId !== actor.id) return { ok: false, status: 403, reason: "Other people's comments cannot be removed." };
		if (now && !same(now, c)) return { ok: false, status: 403, reason: 'A comment cannot be changed once made; add another.' };
	}
	const oldComments = byId(before.comments);
	for (const c of after.comments) {
		if (!oldComments.has(c.id) && c.authorId !== actor.id) return { ok: false, status: 400, reason: 'A new comment must name you as its author.' };
	}
	return { ok: true };
}

/** Marks that are new or differ from the stored ones: only these are checked against today's vocabulary. */
export function changedMarks(before: MarkLayer, after: MarkLayer): Mark[] {
	const old = byId(before.marks);
	return after.marks.filter((m) => !same(m, old.get(m.id)));
}

export function markPoints(m: Mark): Point[] {
	switch (m.kind) {
		case 'outline':
		case 'path':
			return m.points;
		case 'pin':
		case 'control':
			return [m.at];
		case 'box':
		case 'grey':
			return [[m.x, m.y], [m.x + m.w, m.y + m.h]];
		case 'scale':
		case 'level':
			return [m.from, m.to];
	}
}

/** The content rules a schema cannot know: terms from the part's vocabulary, points on the photo. */
export function checkMarkContent(marks: Mark[], photo: { width: number; height: number }, vocabulary: Record<Part, readonly string[]>): ChangeVerdict {
	for (const m of marks) {
		if (isDamage(m) && !vocabulary[m.part].includes(m.term)) return { ok: false, status: 400, reason: `“${m.term}” is not a damage term of the ${m.part}; choose one from its list.` };
		if (m.kind === 'outline') {
			const shape = validOutline(m.points);
			if (!shape.ok) return { ok: false, status: 400, reason: `Outline ${m.id}: ${shape.reason}` };
		}
		for (const [x, y] of markPoints(m)) {
			if (x < 0 || y < 0 || x > photo.width || y > photo.height) return { ok: false, status: 400, reason: `Mark ${m.id} has a point (${Math.round(x)}, ${Math.round(y)}) outside the ${photo.width} × ${photo.height} photograph.` };
		}
	}
	return { ok: true };
}

