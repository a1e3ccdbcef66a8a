import { describe, expect, it } from 'vitest';
import type { MarkLayer } from '../../../../src/lib/marks/schema.ts';
import type { Effect } from '../../../../src/lib/marks/tools/effects.ts';
import { selectTool, type SelectState } from '../../../../src/lib/marks/tools/select.ts';
import { hitTest } from '../../../../src/lib/marks/tools/shapes.ts';
import { click, clock, ctxOf, damage, down, drag, key, layerWith, move, replay, session, up } from './replay.ts';

// Two overlapping boxes (b drawn last, so on top), an outline, a line and a pin inside the outline.
const layer: MarkLayer = layerWith(
	{ id: 'a', kind: 'box', x: 0, y: 0, w: 100, h: 100, ...damage },
	{ id: 'b', kind: 'box', x: 50, y: 50, w: 100, h: 100, ...damage },
	{ id: 'o', kind: 'outline', points: [[300, 300], [500, 300], [500, 500], [300, 500]], ...damage },
	{ id: 'p', kind: 'path', points: [[0, 600], [200, 600], [200, 700]], ...damage },
	{ id: 'pin', kind: 'pin', at: [400, 400], ...damage },
);
const ctx = ctxOf({ marks: layer.marks });
const selected = (ids: string[]): SelectState => ({ ...selectTool.initial(), selected: ids });
const updates = (effects: Effect[]) => effects.filter((e) => e.kind === 'update');
const lastSelect = (effects: Effect[]) => effects.filter((e) => e.kind === 'select').at(-1);

describe('Select: picking', () => {
	it('takes the topmost of overlapping marks', () => {
		const t = clock();
		expect(replay(selectTool, click([75, 75], t), ctx).state.selected).toEqual(['b']);
		expect(replay(selectTool, click([25, 25], t), ctx).state.selected).toEqual(['a']);
		expect(lastSelect(replay(selectTool, click([75, 75], t), ctx).effects)).toEqual({ kind: 'select', ids: ['b'] });
	});

	it('takes a mark by its edge, its line or its pin within tolerance', () => {
		expect(hitTest(layer.marks, [205, 650], 8)).toBe('p');
		expect(hitTest(layer.marks, [210, 650], 8)).toBeNull();
		expect(hitTest(layer.marks, [403, 404], 8)).toBe('pin');
		expect(hitTest(layer.marks, [420, 420], 8)).toBe('o');
		expect(hitTest(layer.marks, [506, 400], 8)).toBe('o');
	});

	it('lets a pin under a larger outline be picked: edges and points beat insides', () => {
		const covered = layerWith({ id: 'pin', kind: 'pin', at: [450, 350], ...damage }, { id: 'o', kind: 'outline', points: [[300, 300], [500, 300], [500, 500]], ...damage });
		expect(hitTest(covered.marks, [451, 349], 8)).toBe('pin');
		expect(hitTest(covered.marks, [480, 320], 8)).toBe('o');
	});

	it('adds and removes marks with Shift-click', () => {
		const t = clock();
		const two = replay(selectTool, [...click([25, 25], t), ...click([140, 140], t, { shift: true })], ctx);
		expect(two.state.selected).toEqual(['a', 'b']);
		const one = replay(selectTool, click([25, 25], t, { shift: true }), ctx, two.state);
		expect(one.state.selected).toEqual(['b']);
		expect(one.effects).toEqual([{ kind: 'select', ids: ['b'] }]);
	});

	it('narrows a multiple selection to the mark clicked without Shift', () => {
		const t = clock();
		expect(replay(selectTool, click([25, 25], t), ctx, selected(['a', 'b', 'o'])).state.selected).toEqual(['a']);
	});

	it('clears the selection on a click on empty photo or Escape', () => {
		const t = clock();
		expect(replay(selectTool, click([900, 900], t), ctx, selected(['a'])).effects).toEqual([{ kind: 'select', ids: [] }]);
		expect(replay(selectTool, [key('Escape')], ctx, selected(['a'])).state.selected).toEqual([]);
		expect(replay(selectTool, click([900, 900], t, { shift: true }), ctx, selected(['a'])).state.selected).toEqual(['a']);
	});

	it('selects the marks wholly inside a rubber band; Shift adds them to the selection', () => {
		const t = clock();
		const band = replay(selectTool, drag([-10, 250], [600, 750], t), ctx);
		expect(band.state.selected).toEqual(['o', 'p', 'pin']);
		expect(band.states[5]!.preview).toMatchObject({ kind: 'band' });
		expect(band.state.preview).toBeNull();
		const more = replay(selectTool, drag([-5, -5], [120, 120], t, 5, { shift: true }), ctx, selected(['pin']));
		expect(more.state.selected).toEqual(['pin', 'a']);
	});

	it('forgets selected marks that are gone (undone, deleted elsewhere)', () => {
		const { state } = replay(selectTool, [move([900, 900], 1)], ctxOf({ marks: layer.marks.filter((m) => m.id !== 'b') }), selected(['a', 'b']));
		expect(state.selected).toEqual(['a']);
	});
});

describe('Select: moving', () => {
	it('moves every selected mark with one update each at the end of the drag, to the exact pixel', () => {
		const t = clock();
		const { effects, states } = replay(selectTool, drag([75, 75], [85.5, 70], t, 50), ctx, selected(['a', 'b', 'pin']));
		expect(updates(effects)).toEqual([
			{ kind: 'update', id: 'a', patch: { x: 10.5, y: -5 } },
			{ kind: 'update', id: 'b', patch: { x: 60.5, y: 45 } },
			{ kind: 'update', id: 'pin', patch: { at: [410.5, 395] } },
		]);
		expect(effects.filter((e) => e.kind !== 'update')).toEqual([]);
		// Within the tolerance it is still a click; beyond it the preview holds the moved marks.
		expect(states[20]!.preview).toBeNull();
		const preview = states[45]!.preview;
		expect(preview?.kind === 'marks' && preview.marks.map((m) => m.id)).toEqual(['a', 'b', 'pin']);
	});

	it('moves an unselected mark at once when it is dragged', () => {
		const t = clock();
		const { effects, state } = replay(selectTool, drag([350, 305], [360, 325], t), ctx);
		expect(effects).toEqual([
			{ kind: 'select', ids: ['o'] },
			{ kind: 'update', id: 'o', patch: { points: [[310, 320], [510, 320], [510, 520], [310, 520]] } },
		]);
		expect(state.selected).toEqual(['o']);
	});

	it('keeps moved marks on the photo', () => {
		const t = clock();
		const { effects } = replay(selectTool, drag([25, 25], [-100, 25], t), ctxOf({ marks: layer.marks, photo: { width: 1000, height: 1000 } }), selected(['a']));
		expect(updates(effects)).toEqual([]);
		const right = replay(selectTool, drag([25, 25], [5000, 25], t), ctxOf({ marks: layer.marks, photo: { width: 1000, height: 1000 } }), selected(['a']));
		expect(updates(right.effects)).toEqual([{ kind: 'update', id: 'a', patch: { x: 900, y: 0 } }]);
	});

	it('drops a drag on Escape, changing nothing', () => {
		const t = clock();
		const { effects, state } = replay(selectTool, [down([25, 25], t()), move([60, 60], t()), key('Escape'), up([60, 60], t())], ctx, selected(['a']));
		expect(updates(effects)).toEqual([]);
		expect(state.preview).toBeNull();
		expect(state.selected).toEqual(['a']);
	});

	it('nudges the selection 1 px with the arrow keys, 10 px with Shift', () => {
		expect(replay(selectTool, [key('ArrowRight')], ctx, selected(['a', 'pin'])).effects).toEqual([
			{ kind: 'update', id: 'a', patch: { x: 1, y: 0 } },
			{ kind: 'update', id: 'pin', patch: { at: [401, 400] } },
		]);
		expect(replay(selectTool, [key('ArrowUp', { shift: true })], ctx, selected(['p'])).effects).toEqual([
			{ kind: 'update', id: 'p', patch: { points: [[0, 590], [200, 590], [200, 690]] } },
		]);
		expect(replay(selectTool, [key('ArrowLeft')], ctx).effects).toEqual([]);
	});

	it('deletes the selection with Delete or Backspace', () => {
		for (const k of ['Delete', 'Backspace']) {
			const { effects, state } = replay(selectTool, [key(k)], ctx, selected(['a', 'pin']));
			expect(effects).toEqual([
				{ kind: 'delete', ids: ['a', 'pin'] },
				{ kind: 'select', ids: [] },
			]);
			expect(state.selected).toEqual([]);
		}
	});
});

describe('Select: vertices', () => {
	it('drags a handle of the single selected outline', () => {
		const t = clock();
		const { effects, states } = replay(selectTool, drag([500, 300], [560, 280], t), ctx, selected(['o']));
		expect(effects).toEqual([{ kind: 'update', id: 'o', patch: { points: [[300, 300], [560, 280], [500, 500], [300, 500]] } }]);
		expect(states[5]!.preview).toMatchObject({ kind: 'marks', marks: [{ id: 'o', points: [[300, 300], [530, 290], [500, 500], [300, 500]] }] });
	});

	it('refuses a vertex drag that makes the outline cross itself, with the reason', () => {
		const t = clock();
		const { effects, state } = replay(selectTool, drag([500, 300], [400, 600], t), ctx, selected(['o']));
		expect(effects).toEqual([]);
		expect(state.message).toMatch(/crosses itself/);
	});

	it('drags a box corner, keeping the opposite corner and a positive size', () => {
		const t = clock();
		expect(replay(selectTool, drag([100, 100], [-20, 40], t), ctx, selected(['a'])).effects).toEqual([{ kind: 'update', id: 'a', patch: { x: -20, y: 0, w: 20, h: 40 } }]);
	});

	it('moves, not reshapes, when several marks are selected', () => {
		const t = clock();
		const { effects } = replay(selectTool, drag([100, 100], [110, 100], t), ctx, selected(['a', 'b']));
		expect(updates(effects).map((e) => e.kind === 'update' && e.patch)).toEqual([
			{ x: 10, y: 0 },
			{ x: 60, y: 50 },
		]);
	});

	it('inserts a vertex with Alt-click on an edge, at the click', () => {
		const t = clock();
		const { effects } = replay(selectTool, click([400, 503], t, { alt: true }), ctx, selected(['o']));
		expect(updates(effects)).toEqual([{ kind: 'update', id: 'o', patch: { points: [[300, 300], [500, 300], [500, 500], [400, 503], [300, 500]] } }]);
		const line = replay(selectTool, click([100, 598], t, { alt: true }), ctx);
		expect(line.effects).toEqual([
			{ kind: 'select', ids: ['p'] },
			{ kind: 'update', id: 'p', patch: { points: [[0, 600], [100, 598], [200, 600], [200, 700]] } },
		]);
	});

	it('removes a vertex with Alt-click on it, but not below the minimum', () => {
		const t = clock();
		expect(updates(replay(selectTool, click([500, 300], t, { alt: true }), ctx, selected(['o'])).effects)).toEqual([
			{ kind: 'update', id: 'o', patch: { points: [[300, 300], [500, 500], [300, 500]] } },
		]);
		const triangle = layerWith({ id: 't', kind: 'outline', points: [[0, 0], [100, 0], [0, 100]], ...damage });
		const refused = replay(selectTool, click([100, 0], t, { alt: true }), ctxOf({ marks: triangle.marks }), selected(['t']));
		expect(refused.effects).toEqual([]);
		expect(refused.state.message).toBe('An outline keeps at least 3 points.');
	});
});

describe('Select in a session', () => {
	it('applies a 50-move drag as one change of the layer', () => {
		const t = clock();
		const { layer: after, history } = session(selectTool, [...click([25, 25], t), ...drag([25, 25], [35, 45], t, 50)], layer);
		expect(after.marks.find((m) => m.id === 'a')).toMatchObject({ x: 10, y: 20, w: 100, h: 100 });
		expect(history.past).toHaveLength(1);
	});

	it('deletes comments pinned to a deleted mark', () => {
		const withComment: MarkLayer = {
			...layer,
			comments: [
				{ id: 'c1', markId: 'a', authorId: layer.marks[0]!.authorId, text: 'Is this a crack or a reflection?', createdAt: layer.marks[0]!.createdAt },
				{ id: 'c2', markId: 'o', authorId: layer.marks[0]!.authorId, text: 'Mould, surely.', createdAt: layer.marks[0]!.createdAt },
			],
		};
		const { layer: after } = session(selectTool, [down([25, 25], 1), up([25, 25], 50), key('Delete')], withComment);
		expect(after.marks.map((m) => m.id)).toEqual(['b', 'o', 'p', 'pin']);
		expect(after.comments.map((c) => c.id)).toEqual(['c2']);
	});
});
