import { validOutline } from '../geometry.ts';
import type { Part } from '../../check/vocabulary.ts';
import { MAX_MARKS_PER_LAYER, MarkSchema, type Level, type Mark, type MarkLayer, type Severity } from '../schema.ts';
import type { DraftMark, Effect, MarkPatch } from './effects.ts';

/**
 * The bridge from the tools to the layer: runs a gesture's effects and returns the new layer, or
 * throws a MarkEditError with a sentence for the person drawing. Every mark it creates or changes
 * is checked against the schema, so an invalid mark never reaches the layer (or the server).
 */

export interface ApplyMeta {
	/** A fresh mark id (the schema's 1–40 letters, digits, _ or -). */
	newId(): string;
	/** ISO 8601 date-time of this edit: createdAt of new marks, updatedAt of changed ones. */
	now: string;
	authorId: string;
	/** What the island's damage panel says about new damage marks. */
	damage: { part: Part; term: string; severity: Severity; note?: string };
	/** Which level a new level line is, when the tool was not told. */
	level?: Level;
	/** The length of a new scale bar, mm (the island asks once the line is drawn). */
	lengthMm?: number;
}

export class MarkEditError extends Error {
	override name = 'MarkEditError';
}

function build(d: DraftMark, meta: ApplyMeta, id: string): unknown {
	const common = { id, authorId: meta.authorId, createdAt: meta.now, updatedAt: meta.now };
	const damage = { part: meta.damage.part, term: meta.damage.term, severity: meta.damage.severity, note: meta.damage.note ?? '' };
	switch (d.kind) {
		case 'outline':
		case 'path':
			return { ...common, ...damage, kind: d.kind, points: d.points };
		case 'pin':
			return { ...common, ...damage, kind: d.kind, at: d.at };
		case 'box':
			return { ...common, ...damage, kind: d.kind, x: d.x, y: d.y, w: d.w, h: d.h };
		case 'scale':
			if (meta.lengthMm === undefined) throw new MarkEditError('The scale bar needs its length in mm.');
			return { ...common, kind: d.kind, from: d.from, to: d.to, lengthMm: meta.lengthMm };
		case 'grey':
			return { ...common, kind: d.kind, x: d.x, y: d.y, w: d.w, h: d.h };
		case 'level': {
			const level = d.level ?? meta.level;
			if (!level) throw new MarkEditError('Choose which level this line marks: the fluid line, the specimen top or the inner base.');
			return { ...common, kind: d.kind, from: d.from, to: d.to, level };
		}
		case 'control':
			return { ...common, kind: d.kind, at: d.at, n: d.n };
	}
}

/** Schema check plus the shape rule the schema cannot state (an outline must not cross itself). */
function valid(candidate: unknown, pointsChanged: boolean): Mark {
	const parsed = MarkSchema.safeParse(candidate);
	if (!parsed.success) throw new MarkEditError(parsed.error.issues[0]?.message ?? 'That mark is not valid.');
	const m = parsed.data;
	if (m.kind === 'outline' && pointsChanged) {
		const check = validOutline(m.points);
		if (!check.ok) throw new MarkEditError(check.reason);
	}
	return m;
}

/** Drop keys whose value is undefined: the schemas are strict, and `{ points: undefined }` on a pin is a stray key. */
const defined = (patch: MarkPatch): MarkPatch => Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined)) as MarkPatch;

/**
 * Run the effects in order. Returns the SAME layer object when nothing in it changed (only
 * selection effects, or ids that no longer exist), so history.push records nothing. A new scale bar
 * replaces the old one (a photo has one); comments pinned to a removed mark go with it.
 */
export function applyEffects(layer: MarkLayer, effects: readonly Effect[], meta: ApplyMeta): MarkLayer {
	let marks = layer.marks;
	const removed = new Set<string>();
	let changed = false;
	for (const e of effects) {
		switch (e.kind) {
			case 'select':
				break;
			case 'commit': {
				const id = meta.newId();
				if (marks.some((m) => m.id === id)) throw new MarkEditError(`Two marks would share the id ${id}.`);
				const mark = valid(build(e.mark, meta, id), true);
				if (mark.kind === 'scale') {
					for (const m of marks) if (m.kind === 'scale') removed.add(m.id);
					marks = marks.filter((m) => m.kind !== 'scale');
				}
				if (marks.length >= MAX_MARKS_PER_LAYER) throw new MarkEditError(`A layer holds at most ${MAX_MARKS_PER_LAYER.toLocaleString('en-GB')} marks.`);
				marks = [...marks, mark];
				changed = true;
				break;
			}
			case 'update': {
				const i = marks.findIndex((m) => m.id === e.id);
				if (i < 0) break;
				const patch = defined(e.patch);
				const next = valid({ ...marks[i]!, ...patch, updatedAt: meta.now }, patch.points !== undefined);
				marks = marks.map((m, j) => (j === i ? next : m));
				changed = true;
				break;
			}
			case 'delete': {
				const ids = new Set(e.ids);
				const kept = marks.filter((m) => !ids.has(m.id));
				if (kept.length === marks.length) break;
				for (const m of marks) if (ids.has(m.id)) removed.add(m.id);
				marks = kept;
				changed = true;
				break;
			}
		}
	}
	if (!changed) return layer;
	const comments = removed.size > 0 ? layer.comments.filter((c) => !removed.has(c.markId)) : layer.comments;
	return { ...layer, marks, comments };
}
