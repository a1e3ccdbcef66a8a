import type { ToolContext, ToolEvent } from './events.ts';
import type { Effect, Tool, ToolId, ToolStateBase } from './effects.ts';
import { boxTool, type BoxState } from './box.ts';
import { lineTool } from './line.ts';
import { controlTool, greyTool, levelTool, scaleTool } from './measure.ts';
import { outlineTool } from './outline.ts';
import { pinTool, type PinState } from './pin.ts';
import type { PlacingState } from './placing.ts';
import { selectTool, type SelectState } from './select.ts';
import { traceTool, type TraceState } from './trace.ts';

/** Every tool, in toolbar order: Select, then the damage tools, then the measurement tools. */
export const TOOLS = [selectTool, outlineTool, traceTool, lineTool, pinTool, boxTool, scaleTool, greyTool, levelTool, controlTool] as const;

/** What the toolbar and the help panel show. */
export const TOOL_LIST: readonly { id: ToolId; label: string; key: string; hint: string }[] = TOOLS.map(({ id, label, key, hint }) => ({ id, label, key, hint }));

interface StateOf {
	select: SelectState;
	outline: PlacingState;
	trace: TraceState;
	line: PlacingState;
	pin: PinState;
	box: BoxState;
	scale: PlacingState;
	grey: BoxState;
	level: PlacingState;
	control: PinState;
}

/** The tool in use and its state; narrow on `id` to read a tool's own fields (e.g. the selection). */
export type ActiveTool = { [K in ToolId]: { id: K; state: StateOf[K] } }[ToolId];

const byId = new Map<ToolId, Tool<ToolStateBase>>(TOOLS.map((t) => [t.id, t]));

export function toolById(id: ToolId): Tool<ToolStateBase> {
	const t = byId.get(id);
	if (!t) throw new RangeError(`No tool ${id}.`);
	return t;
}

/** A fresh tool: switching tools drops whatever the previous one had half drawn. */
export function startTool(id: ToolId): ActiveTool {
	return { id, state: toolById(id).initial() } as ActiveTool;
}

/** Feed one event to the active tool. */
export function reduceTool(active: ActiveTool, event: ToolEvent, ctx: ToolContext): { active: ActiveTool; effects: Effect[] } {
	const { state, effects } = toolById(active.id).reduce(active.state, event, ctx);
	// The registry erases each tool's state type; the id it came with says which it is.
	return { active: { id: active.id, state } as ActiveTool, effects };
}
