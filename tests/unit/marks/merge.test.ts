import { describe, expect, it } from 'vitest';
import { mergeLayers } from '../../../src/lib/marks/merge.ts';
import type { Mark, MarkLayer } from '../../../src/lib/marks/schema.ts';

/** Three-way merge of layers (common practice for optimistic-locking editors, no published source). */
const t = '2026-12-02T10:00:00.000Z';
const pin = (id: string, x: number): Mark => ({ id, kind: 'pin', part: 'lid', term: 'cracked', severity: 1, note: '', at: [x, 10], authorId: '00000000-0000-4000-8000-000000000001', createdAt: t, updatedAt: t });
const layer = (...marks: Mark[]): MarkLayer => ({ schemaVersion: 1, marks, comments: [] });

describe('mergeLayers', () => {
	it('keeps both sides’ additions and each side’s own edits and deletions', () => {
		const base = layer(pin('a', 1), pin('b', 2), pin('c', 3));
		const mine = layer(pin('a', 10), pin('c', 3), pin('m', 4)); // changed a, deleted b, added m
		const theirs = layer(pin('a', 1), pin('b', 2), pin('c', 30), pin('t', 5)); // changed c, added t
		const { layer: out, contested } = mergeLayers(base, mine, theirs);
		expect(out.marks.map((m) => [m.id, m.kind === 'pin' ? m.at[0] : null])).toEqual([['a', 10], ['c', 30], ['t', 5], ['m', 4]]);
		expect(contested).toEqual([]);
	});

	it('lets mine win where both changed a mark, and reports it', () => {
		const { layer: out, contested } = mergeLayers(layer(pin('a', 1)), layer(pin('a', 2)), layer(pin('a', 3)));
		expect(out.marks).toEqual([pin('a', 2)]);
		expect(contested).toEqual(['a']);
	});

	it('keeps their change of a mark I deleted, and mine of a mark they deleted, both reported', () => {
		const a = mergeLayers(layer(pin('a', 1)), layer(), layer(pin('a', 3)));
		expect(a.layer.marks).toEqual([pin('a', 3)]);
		expect(a.contested).toEqual(['a']);
		const b = mergeLayers(layer(pin('a', 1)), layer(pin('a', 2)), layer());
		expect(b.layer.marks).toEqual([pin('a', 2)]);
		expect(b.contested).toEqual(['a']);
	});

	it('keeps their comments and adds my new ones, dropping comments whose mark is gone', () => {
		const c = (id: string, markId: string) => ({ id, markId, authorId: '00000000-0000-4000-8000-000000000002', text: id, createdAt: t });
		const base = { ...layer(pin('a', 1), pin('b', 2)), comments: [c('c0', 'a')] };
		const mine = { ...layer(pin('a', 1)), comments: [c('c0', 'a'), c('c1', 'a')] };
		const theirs = { ...layer(pin('a', 1), pin('b', 2)), comments: [c('c0', 'a'), c('c2', 'b')] };
		expect(mergeLayers(base, mine, theirs).layer.comments.map((x) => x.id)).toEqual(['c0', 'c1']);
	});
});
