import { describe, expect, it } from 'vitest';
import { MarkLayerSchema, emptyLayer, type MarkLayer } from '../../../../src/lib/marks/schema.ts';
import { applyEffects, MarkEditError } from '../../../../src/lib/marks/tools/apply.ts';
import { AUTHOR, NOW, damage, layerWith, metaOf } from './replay.ts';

const LATER = '2026-03-15T11:30:00.000Z';

describe('applyEffects', () => {
	it('turns a drawn outline into a damage mark with the panel’s part, term, severity and note', () => {
		const layer = applyEffects(emptyLayer(), [{ kind: 'commit', mark: { kind: 'outline', points: [[0, 0], [10, 0], [0, 10]] } }], metaOf({ damage: { part: 'specimen', term: 'mould', severity: 3, note: 'Grey bloom.' } }));
		expect(layer.marks).toEqual([
			{ id: 'm1', authorId: AUTHOR, createdAt: NOW, updatedAt: NOW, part: 'specimen', term: 'mould', severity: 3, note: 'Grey bloom.', kind: 'outline', points: [[0, 0], [10, 0], [0, 10]] },
		]);
		expect(MarkLayerSchema.safeParse(layer).success).toBe(true);
	});

	it('gives measurement marks geometry only', () => {
		const layer = applyEffects(
			emptyLayer(),
			[
				{ kind: 'commit', mark: { kind: 'grey', x: 1, y: 2, w: 3, h: 4 } },
				{ kind: 'commit', mark: { kind: 'control', at: [5, 5], n: 1 } },
			],
			metaOf(),
		);
		expect(layer.marks.map((m) => Object.keys(m).sort())).toEqual([
			['authorId', 'createdAt', 'h', 'id', 'kind', 'updatedAt', 'w', 'x', 'y'],
			['at', 'authorId', 'createdAt', 'id', 'kind', 'n', 'updatedAt'],
		]);
	});

	it('patches a mark, stamping the time and keeping author and creation time', () => {
		const layer = layerWith({ id: 'a', kind: 'pin', at: [1, 1], ...damage });
		const after = applyEffects(layer, [{ kind: 'update', id: 'a', patch: { at: [2, 3], severity: 3 } }], metaOf({ now: LATER, authorId: '11111111-2222-4333-8444-555555555555' }));
		expect(after.marks[0]).toMatchObject({ at: [2, 3], severity: 3, updatedAt: LATER, createdAt: NOW, authorId: AUTHOR });
		expect(layer.marks[0]).toMatchObject({ at: [1, 1], severity: 2 });
	});

	it('refuses what would make an invalid mark, with the schema’s sentence', () => {
		const layer = layerWith({ id: 'a', kind: 'pin', at: [1, 1], ...damage }, { id: 'o', kind: 'outline', points: [[0, 0], [10, 0], [0, 10]], ...damage });
		expect(() => applyEffects(layer, [{ kind: 'update', id: 'a', patch: { points: [[0, 0], [1, 1]] } }], metaOf())).toThrow(MarkEditError);
		expect(() => applyEffects(layer, [{ kind: 'update', id: 'o', patch: { points: [[0, 0], [10, 10], [10, 0], [0, 10]] } }], metaOf())).toThrow(/crosses itself/);
		expect(() => applyEffects(layer, [{ kind: 'commit', mark: { kind: 'box', x: 0, y: 0, w: 0, h: 5 } }], metaOf())).toThrow('A box needs a width.');
		expect(() => applyEffects(layer, [{ kind: 'commit', mark: { kind: 'pin', at: [0, 0] } }], metaOf({ newId: () => 'a' }))).toThrow('Two marks would share the id a.');
		expect(() => applyEffects(emptyLayer(), [{ kind: 'commit', mark: { kind: 'pin', at: [0, 0] } }], metaOf({ damage: { ...damage, term: '  ' } }))).toThrow('Choose a damage term.');
	});

	it('returns the same layer when nothing in it changed (so history records nothing)', () => {
		const layer = layerWith({ id: 'a', kind: 'pin', at: [1, 1], ...damage });
		expect(applyEffects(layer, [{ kind: 'select', ids: ['a'] }, { kind: 'update', id: 'gone', patch: { at: [0, 0] } }, { kind: 'delete', ids: ['gone'] }], metaOf())).toBe(layer);
	});

	it('replaces the scale bar: a photo has one', () => {
		const layer: MarkLayer = {
			...layerWith({ id: 's', kind: 'scale', from: [0, 0], to: [100, 0], lengthMm: 10 }),
			comments: [{ id: 'c', markId: 's', authorId: AUTHOR, text: 'Ruler slightly out of focus.', createdAt: NOW }],
		};
		const after = applyEffects(layer, [{ kind: 'commit', mark: { kind: 'scale', from: [0, 10], to: [200, 10] } }], metaOf({ lengthMm: 20 }));
		expect(after.marks).toMatchObject([{ id: 'm1', kind: 'scale', lengthMm: 20 }]);
		expect(after.comments).toEqual([]);
		expect(MarkLayerSchema.safeParse(after).success).toBe(true);
	});

	it('removes the comments pinned to deleted marks, and only those', () => {
		const layer: MarkLayer = {
			...layerWith({ id: 'a', kind: 'pin', at: [1, 1], ...damage }, { id: 'b', kind: 'pin', at: [2, 2], ...damage }),
			comments: [
				{ id: 'c1', markId: 'a', authorId: AUTHOR, text: 'One', createdAt: NOW },
				{ id: 'c2', markId: 'b', authorId: AUTHOR, text: 'Two', createdAt: NOW },
			],
		};
		const after = applyEffects(layer, [{ kind: 'delete', ids: ['a'] }], metaOf());
		expect(after.comments.map((c) => c.id)).toEqual(['c2']);
		expect(MarkLayerSchema.safeParse(after).success).toBe(true);
	});
});
