import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { validOutline } from '../../../../src/lib/marks/geometry.ts';
import { markPoints } from '../../../../src/lib/marks/policy.ts';
import { LEVELS, MarkLayerSchema, emptyLayer, type MarkLayer, type Point } from '../../../../src/lib/marks/schema.ts';
import { applyEffects } from '../../../../src/lib/marks/tools/apply.ts';
import { TOOL_IDS, type ToolId } from '../../../../src/lib/marks/tools/effects.ts';
import type { PointerInput, ToolContext, ToolEvent } from '../../../../src/lib/marks/tools/events.ts';
import { createHistory, push, redo, undo, type History } from '../../../../src/lib/marks/tools/history.ts';
import { reduceTool, startTool } from '../../../../src/lib/marks/tools/index.ts';
import { damage, layerWith, metaOf } from './replay.ts';

/**
 * Whatever a person (or a flaky pointer driver) does, the tools never throw and never put an
 * invalid mark in the layer: every step's layer passes MarkLayerSchema, every outline is a simple
 * polygon, and with a photo size every point is on the photo.
 */

// Mostly a small area, so clicks land on each other; sometimes far off, or not numbers at all.
const coord = fc.oneof(
	{ weight: 30, arbitrary: fc.integer({ min: -40, max: 640 }) },
	{ weight: 6, arbitrary: fc.double({ min: -40, max: 640, noNaN: true }) },
	{ weight: 1, arbitrary: fc.constantFrom(Number.NaN, Infinity, -Infinity, 1e9, -1e9, 1e6, -1e6, 999_999.5) },
);
/**
 * Where the pointer is: a place on the photo, or near a point of a mark already in the layer
 * (resolved when the event is fed), so Select meets marks, handles and edges often enough.
 */
type Pos = { abs: Point } | { mark: number; which: number; off: Point };
const pos: fc.Arbitrary<Pos> = fc.oneof(
	{ weight: 3, arbitrary: fc.tuple(coord, coord).map(([x, y]): Pos => ({ abs: [x, y] })) },
	{
		weight: 2,
		arbitrary: fc
			.tuple(fc.nat(50), fc.nat(10), fc.constantFrom(0, 1, 3, 7, 15, 40), fc.constantFrom(0, -1, 2, -6, 12))
			.map(([mark, which, ox, oy]): Pos => ({ mark, which, off: [ox, oy] })),
	},
);
const mods = fc.record({ shift: fc.boolean(), alt: fc.boolean() });
const gap = fc.constantFrom(0, 16, 80, 250, 301, 1000);
const tol = fc.option(fc.constantFrom(0, 0.25, 4, 8, 40, Number.NaN, -3), { nil: undefined });

type Pointer = { type: PointerInput['type']; at: Pos; gap: number; shift: boolean; alt: boolean; tolerancePx?: number };
type Step = { op: 'events'; events: Pointer[] } | { op: 'key'; event: ToolEvent } | { op: 'cancel' } | { op: 'switch'; tool: ToolId } | { op: 'undo' } | { op: 'redo' };

const raw = fc.tuple(fc.constantFrom('down', 'move', 'up'), pos, gap, tol, mods).map(([type, at, g, t, m]): Pointer => ({ type, at, gap: g, tolerancePx: t, ...m }));
const clickAt = fc.tuple(pos, mods, gap).map(([at, m, g]): Pointer[] => [
	{ type: 'down', at, gap: g, ...m },
	{ type: 'up', at, gap: 80, ...m },
]);
const dragAlong = fc.tuple(fc.array(pos, { minLength: 2, maxLength: 8 }), mods).map(([pts, m]): Pointer[] =>
	pts.map((at, i) => ({ type: i === 0 ? 'down' : i === pts.length - 1 ? 'up' : 'move', at, gap: 16, ...m })),
);
/** Clicks round a centre in angular order (mostly a simple polygon), closed on the first point. */
const polygon = fc
	.tuple(fc.integer({ min: 40, max: 560 }), fc.integer({ min: 40, max: 360 }), fc.array(fc.tuple(fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }), fc.integer({ min: 5, max: 120 })), { minLength: 3, maxLength: 7 }))
	.map(([cx, cy, spokes]): Pointer[] => {
		const pts = spokes.sort((a, b) => a[0] - b[0]).map(([a, r]): Point => [Math.round(cx + r * Math.cos(a)), Math.round(cy + r * Math.sin(a))]);
		return [...pts, pts[0]!].flatMap((p): Pointer[] => [
			{ type: 'down', at: { abs: p }, gap: 400, shift: false, alt: false },
			{ type: 'up', at: { abs: p }, gap: 80, shift: false, alt: false },
		]);
	});
const keys = fc.constantFrom('Enter', 'Escape', 'Backspace', 'Delete', 'ArrowLeft', 'ArrowRight', 'ArrowUp', 'ArrowDown', 'z', 'a', ' ', 'constructor', '__proto__');

const step: fc.Arbitrary<Step> = fc.oneof(
	{ weight: 6, arbitrary: raw.map((e): Step => ({ op: 'events', events: [e] })) },
	{ weight: 8, arbitrary: clickAt.map((events): Step => ({ op: 'events', events })) },
	{ weight: 5, arbitrary: dragAlong.map((events): Step => ({ op: 'events', events })) },
	{ weight: 2, arbitrary: polygon.map((events): Step => ({ op: 'events', events })) },
	{ weight: 3, arbitrary: fc.record({ key: keys, shift: fc.boolean(), ctrl: fc.boolean(), meta: fc.boolean() }).map((k): Step => ({ op: 'key', event: { type: 'key', ...k } })) },
	{ weight: 1, arbitrary: fc.constant<Step>({ op: 'cancel' }) },
	// Select is picked more often: most of what can go wrong is in editing what is there.
	{ weight: 3, arbitrary: fc.constantFrom<ToolId>(...TOOL_IDS, 'select', 'select', 'select').map((tool): Step => ({ op: 'switch', tool })) },
	{ weight: 1, arbitrary: fc.constantFrom<Step>({ op: 'undo' }, { op: 'redo' }) },
);

function resolve(p: Pos, layer: MarkLayer): Point {
	if ('abs' in p) return p.abs;
	const m = layer.marks[p.mark % Math.max(1, layer.marks.length)];
	if (!m) return p.off;
	const pts = markPoints(m);
	const q = pts[p.which % pts.length]!;
	return [q[0] + p.off[0], q[1] + p.off[1]];
}

const setting = fc.record({
	first: fc.constantFrom(...TOOL_IDS),
	tolerancePx: fc.constantFrom(0.5, 8, 30),
	photo: fc.option(fc.constant({ width: 600, height: 400 }), { nil: undefined }),
	level: fc.option(fc.constantFrom(...LEVELS), { nil: undefined }),
	seeded: fc.boolean(),
});

/** One mark of every kind, on a 600 × 400 photo, so editing starts with something to edit. */
const seed = layerWith(
	{ id: 's-outline', kind: 'outline', points: [[100, 100], [220, 90], [240, 200], [120, 230]], ...damage },
	{ id: 's-path', kind: 'path', points: [[300, 50], [380, 70], [420, 160]], ...damage },
	{ id: 's-pin', kind: 'pin', at: [160, 160], ...damage },
	{ id: 's-box', kind: 'box', x: 400, y: 250, w: 120, h: 80, ...damage },
	{ id: 's-scale', kind: 'scale', from: [20, 380], to: [220, 380], lengthMm: 50 },
	{ id: 's-grey', kind: 'grey', x: 500, y: 20, w: 60, h: 40 },
	{ id: 's-level', kind: 'level', level: 'fluid-line', from: [10, 60], to: [590, 62] },
	{ id: 's-control', kind: 'control', n: 1, at: [300, 300] },
);

function checkLayer(layer: MarkLayer, photo: ToolContext['photo']) {
	const parsed = MarkLayerSchema.safeParse(layer);
	expect(parsed.success, parsed.success ? '' : JSON.stringify(parsed.error.issues[0])).toBe(true);
	for (const m of layer.marks) {
		if (m.kind === 'outline') expect(validOutline(m.points)).toEqual({ ok: true });
		if (photo) for (const [x, y] of markPoints(m)) expect(x >= 0 && y >= 0 && x <= photo.width && y <= photo.height).toBe(true);
	}
}

describe('the tools under any sequence of events', () => {
	it('never throw and never produce an invalid mark', () => {
		fc.assert(
			fc.property(setting, fc.array(step, { maxLength: 80, size: 'medium' }), (set, steps) => {
				const meta = metaOf({ level: 'fluid-line', lengthMm: 25 });
				let active = startTool(set.first);
				let history: History = createHistory(set.seeded ? seed : emptyLayer());
				let time = 0;
				const feed = (event: ToolEvent) => {
					const ctx: ToolContext = { tolerancePx: set.tolerancePx, marks: history.present.marks, photo: set.photo, level: set.level };
					const r = reduceTool(active, event, ctx);
					active = r.active;
					const before = history.present;
					history = push(history, applyEffects(before, r.effects, meta));
					// Only a changed layer can have gone wrong (and parsing every hover would make the run slow).
					if (history.present !== before) checkLayer(history.present, set.photo);
				};
				for (const s of steps) {
					if (s.op === 'events') {
						for (const { gap: g, at, ...e } of s.events) feed({ ...e, at: resolve(at, history.present), time: (time += g) });
					} else if (s.op === 'key') feed(s.event);
					else if (s.op === 'cancel') feed({ type: 'cancel' });
					else if (s.op === 'switch') active = startTool(s.tool);
					else history = s.op === 'undo' ? undo(history) : redo(history);
				}
			}),
			{ numRuns: 250 },
		);
	});
});
