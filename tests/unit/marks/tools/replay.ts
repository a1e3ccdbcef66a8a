import type { Mark, MarkLayer, Point } from '../../../../src/lib/marks/schema.ts';
import { emptyLayer } from '../../../../src/lib/marks/schema.ts';
import { applyEffects, type ApplyMeta } from '../../../../src/lib/marks/tools/apply.ts';
import type { Effect, Tool, ToolStateBase } from '../../../../src/lib/marks/tools/effects.ts';
import type { PointerInput, ToolContext, ToolEvent } from '../../../../src/lib/marks/tools/events.ts';
import { createHistory, push, type History } from '../../../../src/lib/marks/tools/history.ts';

/** Replaying events into the tools without a canvas: what the island does, minus the drawing. */

export const AUTHOR = '5f0c8a52-3c1e-4f7b-9a1d-2b6e8c4d7a10';
export const NOW = '2026-03-15T10:00:00.000Z';

export const ctxOf = (over: Partial<ToolContext> = {}): ToolContext => ({ tolerancePx: 8, marks: [], ...over });

export function metaOf(over: Partial<ApplyMeta> = {}): ApplyMeta {
	let n = 0;
	return {
		newId: () => `m${++n}`,
		now: NOW,
		authorId: AUTHOR,
		damage: { part: 'container', term: 'cracked', severity: 2, note: '' },
		lengthMm: 50,
		level: 'fluid-line',
		...over,
	};
}

/** A clock for event times; clicks far apart in time unless asked otherwise, so none is a double-click by accident. */
export function clock(start = 1000) {
	let t = start;
	return (gap = 1000) => (t += gap);
}

type Mods = { shift?: boolean; alt?: boolean };
export const down = (at: Point, time: number, mods: Mods = {}): PointerInput => ({ type: 'down', at, time, ...mods });
export const move = (at: Point, time: number, mods: Mods = {}): PointerInput => ({ type: 'move', at, time, ...mods });
export const up = (at: Point, time: number, mods: Mods = {}): PointerInput => ({ type: 'up', at, time, ...mods });
export const key = (k: string, mods: { shift?: boolean; ctrl?: boolean; meta?: boolean } = {}): ToolEvent => ({ type: 'key', key: k, ...mods });

/** A click: down and up at the same spot, 80 ms apart. */
export function click(at: Point, tick: (gap?: number) => number, mods: Mods = {}, gap = 1000): PointerInput[] {
	const t = tick(gap);
	return [down(at, t, mods), up(at, t + 80, mods)];
}

/** A drag from `from` to `to` in `steps` moves, then the release at `to`. */
export function drag(from: Point, to: Point, tick: (gap?: number) => number, steps = 10, mods: Mods = {}): PointerInput[] {
	const t = tick();
	const evs: PointerInput[] = [down(from, t, mods)];
	for (let i = 1; i <= steps; i++) {
		const f = i / steps;
		evs.push(move([from[0] + (to[0] - from[0]) * f, from[1] + (to[1] - from[1]) * f], t + i * 16, mods));
	}
	evs.push(up(to, t + (steps + 1) * 16, mods));
	return evs;
}

/** Feed events to one tool; collect every effect. */
export function replay<S extends ToolStateBase>(tool: Tool<S>, events: readonly ToolEvent[], ctx: ToolContext = ctxOf(), from?: S): { state: S; effects: Effect[]; states: S[] } {
	let state = from ?? tool.initial();
	const effects: Effect[] = [];
	const states: S[] = [];
	for (const e of events) {
		const r = tool.reduce(state, e, ctx);
		state = r.state;
		states.push(state);
		effects.push(...r.effects);
	}
	return { state, effects, states };
}

export const commits = (effects: readonly Effect[]) => effects.flatMap((e) => (e.kind === 'commit' ? [e.mark] : []));

/**
 * A whole editing session: the tool sees the current marks, its effects are applied to the layer
 * after every event, and the layer is pushed to the history (a no-op when nothing changed).
 */
export function session<S extends ToolStateBase>(tool: Tool<S>, events: readonly ToolEvent[], layer: MarkLayer = emptyLayer(), opts: { ctx?: Partial<ToolContext>; meta?: ApplyMeta; state?: S } = {}) {
	const meta = opts.meta ?? metaOf();
	let history: History = createHistory(layer);
	let state = opts.state ?? tool.initial();
	const effects: Effect[] = [];
	for (const e of events) {
		const r = tool.reduce(state, e, ctxOf({ ...opts.ctx, marks: history.present.marks }));
		state = r.state;
		effects.push(...r.effects);
		history = push(history, applyEffects(history.present, r.effects, meta));
	}
	return { state, effects, history, layer: history.present };
}

/** A layer holding the given marks, with valid common fields filled in. */
export function layerWith(...marks: Array<Record<string, unknown>>): MarkLayer {
	const common = { authorId: AUTHOR, createdAt: NOW, updatedAt: NOW };
	return { ...emptyLayer(), marks: marks.map((m) => ({ ...common, ...m }) as Mark) };
}

export const damage = { part: 'container', term: 'cracked', severity: 2, note: '' } as const;
