import { describe, expect, it } from 'vitest';
import type { Point } from '../../../../src/lib/marks/schema.ts';
import { applyEffects, MarkEditError } from '../../../../src/lib/marks/tools/apply.ts';
import { boxTool } from '../../../../src/lib/marks/tools/box.ts';
import { lineTool } from '../../../../src/lib/marks/tools/line.ts';
import { controlTool, greyTool, levelTool, nextControlNumber, scaleTool } from '../../../../src/lib/marks/tools/measure.ts';
import { pinTool } from '../../../../src/lib/marks/tools/pin.ts';
import { DOUBLE_CLICK_MS } from '../../../../src/lib/marks/tools/placing.ts';
import { emptyLayer } from '../../../../src/lib/marks/schema.ts';
import { click, clock, commits, ctxOf, down, drag, key, layerWith, metaOf, move, replay, up } from './replay.ts';

describe('Line', () => {
	it('draws one straight segment by a drag', () => {
		const t = clock();
		const { effects, states } = replay(lineTool, drag([10, 20], [210, 120], t));
		expect(effects).toEqual([{ kind: 'commit', mark: { kind: 'path', points: [[10, 20], [210, 120]] } }]);
		// While dragging, the loose end follows the pointer.
		expect(states[5]!.preview).toMatchObject({ kind: 'polyline', points: [[10, 20]], rubber: [110, 70] });
	});

	it('draws a multi-segment line by clicks and a double-click', () => {
		const t = clock();
		const pts: Point[] = [
			[0, 0],
			[50, 10],
			[90, 60],
		];
		const events = [...pts.flatMap((p) => click(p, t)), ...click([91, 61], t, {}, DOUBLE_CLICK_MS - 100)];
		expect(commits(replay(lineTool, events).effects)).toEqual([{ kind: 'path', points: pts }]);
	});

	it('does not take two slow clicks on one spot for a double-click', () => {
		const t = clock();
		const { effects, state } = replay(lineTool, [...click([0, 0], t), ...click([50, 0], t), ...click([50, 0], t, {}, DOUBLE_CLICK_MS + 200)]);
		expect(effects).toEqual([]);
		expect(state.points).toEqual([
			[0, 0],
			[50, 0],
		]);
	});

	it('finishes on Enter with 2 points or more, says so with fewer, cancels on Escape', () => {
		const t = clock();
		expect(commits(replay(lineTool, [...click([0, 0], t), ...click([30, 40], t), key('Enter')]).effects)).toEqual([{ kind: 'path', points: [[0, 0], [30, 40]] }]);
		expect(replay(lineTool, [...click([0, 0], t), key('Enter')]).state.message).toBe('A line needs at least 2 points; it has 1.');
		expect(replay(lineTool, [...click([0, 0], t), ...click([30, 40], t), key('Escape'), key('Enter')]).effects).toEqual([]);
	});

	it('keeps the points already placed when the pointer is cancelled', () => {
		const t = clock();
		const { state } = replay(lineTool, [...click([0, 0], t), down([40, 0], t()), { type: 'cancel' }]);
		expect(state.points).toEqual([[0, 0]]);
		expect(state.press).toBeNull();
	});
});

describe('Pin', () => {
	it('drops a pin with a click', () => {
		const t = clock();
		expect(replay(pinTool, click([42, 17], t)).effects).toEqual([{ kind: 'commit', mark: { kind: 'pin', at: [42, 17] } }]);
	});
	it('follows the pointer while pressed and drops where released', () => {
		const t = clock();
		const { effects, states } = replay(pinTool, [down([10, 10], t()), move([12, 14], t()), up([13, 15], t())]);
		expect(states[1]!.preview).toEqual({ kind: 'draft', mark: { kind: 'pin', at: [12, 14] } });
		expect(commits(effects)).toEqual([{ kind: 'pin', at: [13, 15] }]);
	});
});

describe('Box', () => {
	it('normalises a drag in any direction so w and h are positive', () => {
		const t = clock();
		expect(commits(replay(boxTool, drag([100, 80], [20, 10], t)).effects)).toEqual([{ kind: 'box', x: 20, y: 10, w: 80, h: 70 }]);
	});
	it('makes a square with Shift, the longer side winning, toward the pointer', () => {
		const t = clock();
		expect(commits(replay(boxTool, drag([100, 80], [20, 50], t, 10, { shift: true })).effects)).toEqual([{ kind: 'box', x: 20, y: 0, w: 80, h: 80 }]);
	});
	it('ignores a box thinner than the tolerance', () => {
		const t = clock();
		expect(replay(boxTool, drag([100, 80], [300, 85], t)).effects).toEqual([]);
		expect(replay(boxTool, click([5, 5], t)).effects).toEqual([]);
	});
	it('keeps a square on the photo', () => {
		const t = clock();
		const [mark] = commits(replay(boxTool, drag([550, 350], [590, 200], t, 5, { shift: true }), ctxOf({ photo: { width: 600, height: 400 } })).effects);
		expect(mark).toEqual({ kind: 'box', x: 550, y: 300, w: 50, h: 50 });
	});
});

describe('measurement tools', () => {
	it('Scale bar: a two-point line by a drag or by two clicks', () => {
		const t = clock();
		expect(commits(replay(scaleTool, drag([0, 500], [400, 500], t)).effects)).toEqual([{ kind: 'scale', from: [0, 500], to: [400, 500] }]);
		expect(commits(replay(scaleTool, [...click([0, 500], t), ...click([400, 502], t)]).effects)).toEqual([{ kind: 'scale', from: [0, 500], to: [400, 502] }]);
	});

	it('Scale bar and Level: a drag that returns to where it began draws no zero-length line (found by the property test)', () => {
		for (const tool of [scaleTool, levelTool]) {
			const t = clock();
			const there = drag([100, 100], [300, 100], t);
			// Out to (300, 100), back, and released on the starting point: a click, placing one end only.
			const back = [...there.slice(0, -1), move([100, 100], t(16)), up([100, 100], t(16))];
			const r = replay(tool, back);
			expect(commits(r.effects)).toEqual([]);
			expect(r.state.points).toEqual([[100, 100]]);
			// The next click finishes it with two different ends.
			expect(commits(replay(tool, click([100, 300], t), ctxOf(), r.state).effects)).toMatchObject([{ from: [100, 100], to: [100, 300] }]);
		}
	});

	it('Scale bar: the island gives the length in mm when applying, and must', () => {
		const t = clock();
		const { effects } = replay(scaleTool, drag([0, 500], [400, 500], t));
		expect(applyEffects(emptyLayer(), effects, metaOf({ lengthMm: 100 })).marks[0]).toMatchObject({ kind: 'scale', lengthMm: 100 });
		expect(() => applyEffects(emptyLayer(), effects, metaOf({ lengthMm: undefined }))).toThrow(new MarkEditError('The scale bar needs its length in mm.'));
	});

	it('Level: records the level given in the context, else the one the island gives when applying', () => {
		const t = clock();
		expect(commits(replay(levelTool, drag([0, 100], [300, 104], t), ctxOf({ level: 'specimen-top' })).effects)).toEqual([
			{ kind: 'level', from: [0, 100], to: [300, 104], level: 'specimen-top' },
		]);
		const unnamed = replay(levelTool, drag([0, 100], [300, 104], t)).effects;
		expect(commits(unnamed)).toEqual([{ kind: 'level', from: [0, 100], to: [300, 104] }]);
		expect(applyEffects(emptyLayer(), unnamed, metaOf({ level: 'inner-base' })).marks[0]).toMatchObject({ level: 'inner-base' });
		expect(() => applyEffects(emptyLayer(), unnamed, metaOf({ level: undefined }))).toThrow(/Choose which level/);
	});

	it('Grey card: a box', () => {
		const t = clock();
		expect(commits(replay(greyTool, drag([10, 10], [60, 40], t)).effects)).toEqual([{ kind: 'grey', x: 10, y: 10, w: 50, h: 30 }]);
	});

	it('Control point: a pin numbered with the lowest free number of the layer', () => {
		const t = clock();
		const layer = layerWith({ id: 'c1', kind: 'control', n: 1, at: [0, 0] }, { id: 'c3', kind: 'control', n: 3, at: [9, 9] });
		expect(nextControlNumber(layer.marks)).toBe(2);
		expect(commits(replay(controlTool, click([50, 60], t), ctxOf({ marks: layer.marks })).effects)).toEqual([{ kind: 'control', at: [50, 60], n: 2 }]);
		expect(commits(replay(controlTool, click([50, 60], t)).effects)).toEqual([{ kind: 'control', at: [50, 60], n: 1 }]);
	});

	it('Control point: refuses a thousandth', () => {
		const t = clock();
		const full = layerWith(...Array.from({ length: 999 }, (_, i) => ({ id: `c${i + 1}`, kind: 'control', n: i + 1, at: [i, i] })));
		const { effects, state } = replay(controlTool, click([5, 5], t), ctxOf({ marks: full.marks }));
		expect(effects).toEqual([]);
		expect(state.message).toBe('A photo has at most 999 control points.');
	});
});

describe('every drawing tool', () => {
	it('ignores pointer positions that are not finite numbers', () => {
		const t = clock();
		expect(replay(pinTool, click([Number.NaN, 5], t)).effects).toEqual([]);
		expect(replay(boxTool, drag([0, 0], [Infinity, 50], t)).effects).toEqual([]);
	});
});
