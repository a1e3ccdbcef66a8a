import { describe, expect, it } from 'vitest';
import { distanceToPolyline, validOutline } from '../../../../src/lib/marks/geometry.ts';
import type { Point } from '../../../../src/lib/marks/schema.ts';
import { traceTool } from '../../../../src/lib/marks/tools/trace.ts';
import type { PointerInput } from '../../../../src/lib/marks/tools/events.ts';
import { commits, ctxOf, key, replay } from './replay.ts';

/** A small deterministic generator (mulberry32), so the noisy strokes are the same every run. */
function rng(seed: number) {
	return () => {
		seed = (seed + 0x6d2b79f5) | 0;
		let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
		t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

function stroke(points: Point[], mods: { alt?: boolean } = {}): PointerInput[] {
	return points.map((at, i) => ({ type: i === 0 ? 'down' : i === points.length - 1 ? 'up' : 'move', at, time: 1000 + i * 8, ...mods }));
}

const TOL = 8;

function noisyArc(from: number, to: number, n: number, noise: number, seed = 7): Point[] {
	const r = rng(seed);
	return Array.from({ length: n + 1 }, (_, i) => {
		const a = from + ((to - from) * i) / n;
		const radius = 200 + (r() - 0.5) * 2 * noise;
		return [500 + radius * Math.cos(a), 500 + radius * Math.sin(a)] as Point;
	});
}

describe('Trace', () => {
	it('turns a noisy circle into a closed outline with far fewer points, every sample within tolerance', () => {
		const raw = noisyArc(0, 2 * Math.PI, 600, 1.5);
		const { effects, state } = replay(traceTool, stroke(raw), ctxOf({ tolerancePx: TOL }));
		const [mark] = commits(effects);
		expect(mark?.kind).toBe('outline');
		if (mark?.kind !== 'outline') return;
		expect(mark.points.length).toBeGreaterThanOrEqual(8);
		expect(mark.points.length).toBeLessThan(raw.length / 10);
		expect(validOutline(mark.points)).toEqual({ ok: true });
		const ring = [...mark.points, mark.points[0]!];
		for (const p of raw) expect(distanceToPolyline(p, ring)).toBeLessThanOrEqual(TOL);
		expect(state.stroke).toBeNull();
	});

	it('keeps an open stroke as a simplified line', () => {
		const raw = noisyArc(0, Math.PI, 300, 1);
		const [mark] = commits(replay(traceTool, stroke(raw), ctxOf({ tolerancePx: TOL })).effects);
		expect(mark?.kind).toBe('path');
		if (mark?.kind !== 'path') return;
		expect(mark.points[0]).toEqual(raw[0]);
		expect(mark.points[mark.points.length - 1]).toEqual(raw[raw.length - 1]);
		expect(mark.points.length).toBeLessThan(30);
		for (const p of raw) expect(distanceToPolyline(p, mark.points)).toBeLessThanOrEqual(TOL);
	});

	it('closes an open stroke when Alt is held', () => {
		const raw = noisyArc(0, 1.5 * Math.PI, 300, 1);
		const [mark] = commits(replay(traceTool, stroke(raw, { alt: true }), ctxOf({ tolerancePx: TOL })).effects);
		expect(mark?.kind).toBe('outline');
	});

	it('keeps a figure-of-eight as a line, and says why', () => {
		const eight: Point[] = Array.from({ length: 201 }, (_, i) => {
			const a = (2 * Math.PI * i) / 200;
			return [300 + 150 * Math.sin(a), 300 + 100 * Math.sin(2 * a)];
		});
		const { effects, state } = replay(traceTool, stroke(eight), ctxOf({ tolerancePx: TOL }));
		expect(commits(effects).map((m) => m.kind)).toEqual(['path']);
		expect(state.message).toMatch(/crosses itself.*kept as a line/);
	});

	it('ignores jitter that never leaves the tolerance', () => {
		const r = rng(3);
		const shaky = Array.from({ length: 30 }, () => [100 + (r() - 0.5) * 5, 100 + (r() - 0.5) * 5] as Point);
		expect(replay(traceTool, stroke(shaky), ctxOf({ tolerancePx: TOL })).effects).toEqual([]);
	});

	it('thins samples closer than a quarter of the tolerance as they arrive', () => {
		const dense = Array.from({ length: 101 }, (_, i) => [100 + i * 0.5, 100] as Point);
		const { state } = replay(traceTool, stroke(dense).slice(0, -1), ctxOf({ tolerancePx: TOL }));
		expect(state.stroke!.length).toBe(25); // every 4th sample (2 px apart) of the 97 before the release
		expect(state.preview).toMatchObject({ kind: 'polyline', closes: false });
	});

	it('drops the stroke on Escape or cancel', () => {
		const raw = noisyArc(0, Math.PI, 50, 0);
		const partial = stroke(raw).slice(0, -1);
		expect(replay(traceTool, [...partial, key('Escape'), stroke(raw).at(-1)!]).effects).toEqual([]);
		expect(replay(traceTool, [...partial, { type: 'cancel' }]).state.stroke).toBeNull();
	});
});
