import { describe, expect, it } from 'vitest';
import { outlineTool } from '../../../../src/lib/marks/tools/outline.ts';
import type { Point } from '../../../../src/lib/marks/schema.ts';
import { click, clock, commits, ctxOf, key, move, replay } from './replay.ts';

const square: Point[] = [
	[100, 100],
	[300, 100],
	[300, 300],
	[100, 300],
];

describe('Outline', () => {
	it('closes on a click on the first point: one commit with the 4 points placed', () => {
		const t = clock();
		const { state, effects } = replay(outlineTool, [...square.flatMap((p) => click(p, t)), ...click([103, 98], t)]);
		expect(effects).toEqual([{ kind: 'commit', mark: { kind: 'outline', points: square } }]);
		expect(state.points).toEqual([]);
		expect(state.preview).toBeNull();
	});

	it('closes on Enter the same way', () => {
		const t = clock();
		const { effects } = replay(outlineTool, [...square.flatMap((p) => click(p, t)), key('Enter')]);
		expect(commits(effects)).toEqual([{ kind: 'outline', points: square }]);
	});

	it('closes on a double-click, without a doubled last point', () => {
		const t = clock();
		const events = [...square.slice(0, 3).flatMap((p) => click(p, t)), ...click(square[3]!, t), ...click(square[3]!, t, {}, 150)];
		expect(commits(replay(outlineTool, events).effects)).toEqual([{ kind: 'outline', points: square }]);
	});

	it('refuses a bow-tie with the reason and keeps its points to be fixed', () => {
		const t = clock();
		const bowTie: Point[] = [
			[0, 0],
			[200, 200],
			[200, 0],
			[0, 200],
		];
		const refused = replay(outlineTool, [...bowTie.flatMap((p) => click(p, t)), key('Enter')]);
		expect(refused.effects).toEqual([]);
		expect(refused.state.message).toMatch(/crosses itself/);
		expect(refused.state.points).toEqual(bowTie);
		// Taking back the last point leaves a triangle, which closes.
		const fixed = replay(outlineTool, [key('Backspace'), key('Enter')], ctxOf(), refused.state);
		expect(commits(fixed.effects)).toEqual([{ kind: 'outline', points: bowTie.slice(0, 3) }]);
		expect(fixed.state.message).toBeNull();
	});

	it('takes back the last point on Backspace', () => {
		const t = clock();
		const { state, effects } = replay(outlineTool, [...square.flatMap((p) => click(p, t)), key('Backspace')]);
		expect(effects).toEqual([]);
		expect(state.points).toEqual(square.slice(0, 3));
	});

	it('drops everything on Escape', () => {
		const t = clock();
		const { state } = replay(outlineTool, [...square.flatMap((p) => click(p, t)), key('Escape'), key('Enter')]);
		expect(state.points).toEqual([]);
		expect(state.message).toMatch(/at least 3 points; it has 0/);
	});

	it('needs 3 points: Enter, or a click back on the first point, with fewer says so', () => {
		const t = clock();
		const enter = replay(outlineTool, [...square.slice(0, 2).flatMap((p) => click(p, t)), key('Enter')]);
		expect(enter.effects).toEqual([]);
		expect(enter.state.message).toBe('An outline needs at least 3 points; it has 2.');
		const back = replay(outlineTool, [...square.slice(0, 2).flatMap((p) => click(p, t)), ...click([101, 101], t)]);
		expect(back.state.points).toEqual(square.slice(0, 2));
		expect(back.state.message).toMatch(/at least 3/);
	});

	it('ignores a second click on the last point (no zero-length edge)', () => {
		const t = clock();
		const { state } = replay(outlineTool, [...click([10, 10], t), ...click([12, 11], t)]);
		expect(state.points).toEqual([[10, 10]]);
	});

	it('previews the rubber band, and shows when the next click would close', () => {
		const t = clock();
		const placed = replay(outlineTool, square.slice(0, 3).flatMap((p) => click(p, t))).state;
		expect(replay(outlineTool, [move([150, 250], t())], ctxOf(), placed).state.preview).toEqual({
			kind: 'polyline',
			points: square.slice(0, 3),
			rubber: [150, 250],
			closed: false,
			closes: false,
		});
		const closing = replay(outlineTool, [move([104, 97], t())], ctxOf(), placed).state.preview;
		expect(closing).toMatchObject({ closes: true, rubber: [100, 100] });
	});

	it('snaps with the tolerance of the event when it gives one (the view zoomed)', () => {
		const t = clock();
		const placed = replay(outlineTool, square.flatMap((p) => click(p, t))).state;
		const far: Point = [130, 100];
		const zoomedOut = replay(outlineTool, click(far, t).map((e) => ({ ...e, tolerancePx: 40 })), ctxOf(), placed);
		expect(commits(zoomedOut.effects)).toHaveLength(1);
		const zoomedIn = replay(outlineTool, click(far, t), ctxOf(), placed);
		expect(zoomedIn.state.points).toHaveLength(5);
	});

	it('keeps points on the photo when its size is known', () => {
		const t = clock();
		const { state } = replay(outlineTool, click([-20, 900], t), ctxOf({ photo: { width: 600, height: 400 } }));
		expect(state.points).toEqual([[0, 400]]);
	});
});
