import { describe, expect, it } from 'vitest';
import { emptyLayer } from '../../../../src/lib/marks/schema.ts';
import { canRedo, canUndo, createHistory, HISTORY_CAP, push, redo, undo } from '../../../../src/lib/marks/tools/history.ts';
import { outlineTool } from '../../../../src/lib/marks/tools/outline.ts';
import { selectTool } from '../../../../src/lib/marks/tools/select.ts';
import { click, clock, damage, drag, layerWith, session } from './replay.ts';

describe('history', () => {
	it('undoes and redoes in order, and a new edit clears what could be redone', () => {
		let h = createHistory('a');
		expect(canUndo(h)).toBe(false);
		h = push(push(h, 'b'), 'c');
		h = undo(h);
		expect(h.present).toBe('b');
		h = undo(h);
		expect(h.present).toBe('a');
		expect([canUndo(h), canRedo(h)]).toEqual([false, true]);
		expect(undo(h)).toBe(h);
		h = redo(h);
		expect(h.present).toBe('b');
		h = push(h, 'd');
		expect([h.present, canRedo(h)]).toEqual(['d', false]);
		expect(redo(h)).toBe(h);
		expect(undo(undo(h)).present).toBe('a');
	});

	it('is immutable: an older history still says what it said', () => {
		const h1 = push(createHistory('a'), 'b');
		const h2 = undo(h1);
		expect(h1.present).toBe('b');
		expect(h2.present).toBe('a');
	});

	it('records nothing for the same state again', () => {
		const h = push(createHistory('a'), 'b');
		expect(push(h, 'b')).toBe(h);
	});

	it('keeps at most the cap, dropping the oldest', () => {
		let h = createHistory(0);
		for (let i = 1; i <= HISTORY_CAP + 50; i++) h = push(h, i);
		expect(h.past).toHaveLength(HISTORY_CAP);
		expect(h.past[0]).toBe(50);
		let back = h;
		while (canUndo(back)) back = undo(back);
		expect(back.present).toBe(50);
		const small = push(push(push(createHistory('a', 2), 'b'), 'c'), 'd');
		expect(small.past).toEqual(['b', 'c']);
	});

	it('makes a move of 50 pointer moves one entry, and undo puts the mark back', () => {
		const t = clock();
		const layer = layerWith({ id: 'a', kind: 'box', x: 0, y: 0, w: 100, h: 100, ...damage });
		const { history } = session(selectTool, [...click([50, 50], t), ...drag([50, 50], [80, 90], t, 50)], layer);
		expect(history.past).toHaveLength(1);
		expect(history.present.marks[0]).toMatchObject({ x: 30, y: 40 });
		expect(undo(history).present).toBe(layer);
		expect(redo(undo(history)).present).toBe(history.present);
	});

	it('makes an outline of many clicks one entry', () => {
		const t = clock();
		const clicks = [[0, 0], [100, 0], [100, 100], [50, 150], [0, 100], [0, 0]].flatMap(([x, y]) => click([x!, y!], t));
		const { history } = session(outlineTool, clicks, emptyLayer());
		expect(history.past).toHaveLength(1);
		expect(history.present.marks).toHaveLength(1);
	});
});
