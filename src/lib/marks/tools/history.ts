import type { MarkLayer } from '../schema.ts';

/**
 * Undo and redo over whole layer states. The island pushes the layer once per finished gesture
 * (the tools only emit effects at the end of one), so a drag of fifty moves is one step. States
 * are shared, not copied: layers are never changed in place (apply.ts builds new ones).
 */
export interface History<T = MarkLayer> {
	past: readonly T[];
	present: T;
	future: readonly T[];
	/** How many undo steps are kept; the oldest go first. */
	cap: number;
}

export const HISTORY_CAP = 200;

export function createHistory<T>(present: T, cap: number = HISTORY_CAP): History<T> {
	return { past: [], present, future: [], cap: Math.max(1, Math.floor(Number.isFinite(cap) ? cap : HISTORY_CAP)) };
}

/**
 * Record a new state. The same object again (an effect list that changed nothing) records nothing;
 * anything new clears what could be redone, as it no longer follows from here.
 */
export function push<T>(h: History<T>, next: T): History<T> {
	if (next === h.present) return h;
	const past = [...h.past, h.present];
	return { ...h, past: past.length > h.cap ? past.slice(past.length - h.cap) : past, present: next, future: [] };
}

export const canUndo = (h: History<unknown>): boolean => h.past.length > 0;
export const canRedo = (h: History<unknown>): boolean => h.future.length > 0;

export function undo<T>(h: History<T>): History<T> {
	if (h.past.length === 0) return h;
	return { ...h, past: h.past.slice(0, -1), present: h.past[h.past.length - 1]!, future: [h.present, ...h.future] };
}

export function redo<T>(h: History<T>): History<T> {
	if (h.future.length === 0) return h;
	return { ...h, past: [...h.past, h.present], present: h.future[0]!, future: h.future.slice(1) };
}
