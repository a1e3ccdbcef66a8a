import type { MarkLayer } from './schema.ts';

/**
 * Three-way merge of mark layers, for a save refused because someone else saved first: start from
 * what they saved (`theirs`), then replay what this person did since loading (`base` → `mine`):
 * marks added are added, marks changed replace theirs, marks deleted are deleted; comments are
 * theirs plus any new ones of mine. Where both changed the same mark, mine wins, and the mark's id
 * is reported so the editor can say which ones to look at again.
 */
export interface MergeResult {
	layer: MarkLayer;
	/** Marks both people changed (or one changed and the other deleted). */
	contested: string[];
}

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

export function mergeLayers(base: MarkLayer, mine: MarkLayer, theirs: MarkLayer): MergeResult {
	const baseById = new Map(base.marks.map((m) => [m.id, m]));
	const mineById = new Map(mine.marks.map((m) => [m.id, m]));
	const theirsById = new Map(theirs.marks.map((m) => [m.id, m]));
	const contested: string[] = [];
	const marks = theirs.marks.flatMap((t) => {
		const b = baseById.get(t.id);
		const m = mineById.get(t.id);
		if (!b) return [t]; // theirs alone
		const theyChanged = !same(t, b);
		if (!m) {
			// I deleted it; if they changed it meanwhile, keep their change and say so.
			if (theyChanged) {
				contested.push(t.id);
				return [t];
			}
			return [];
		}
		if (same(m, b)) return [t];
		if (theyChanged && !same(m, t)) contested.push(t.id);
		return [m];
	});
	for (const m of mine.marks) {
		if (theirsById.has(m.id)) continue;
		const b = baseById.get(m.id);
		if (!b) marks.push(m); // new of mine
		else if (!same(m, b)) {
			// I changed what they deleted: keep mine, flagged.
			contested.push(m.id);
			marks.push(m);
		}
	}
	const kept = new Set(marks.map((m) => m.id));
	const baseComments = new Set(base.comments.map((c) => c.id));
	const theirComments = new Set(theirs.comments.map((c) => c.id));
	const comments = [...theirs.comments, ...mine.comments.filter((c) => !baseComments.has(c.id) && !theirComments.has(c.id))].filter((c) => kept.has(c.markId));
	return { layer: { schemaVersion: theirs.schemaVersion, marks, comments }, contested };
}
