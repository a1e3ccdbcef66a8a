import type { KeyInput } from './events.ts';
import type { ToolId } from './effects.ts';
import { TOOL_LIST } from './index.ts';

/**
 * The keyboard, as data: the help panel lists it and the island matches key presses against it.
 * Rows marked `to: 'tool'` are passed to the active tool as key events (they mean different things
 * to different tools: Backspace takes back a point while drawing and deletes the selection in
 * Select); rows marked `to: 'app'` are the island's own (switch tool, undo, zoom).
 */
export interface KeyCombo {
	/** KeyboardEvent.key; letters in lower case (matched regardless of case). */
	key: string;
	/** Ctrl, or ⌘ on a Mac. */
	mod?: boolean;
	/** Ctrl itself, on every platform (Ctrl+Y is redo on Windows and Linux). */
	ctrl?: boolean;
	/** true: Shift must be down; false/absent: must not be; 'any': either (Shift changes the step, or is needed to type the key). */
	shift?: boolean | 'any';
}

export type ShortcutAction = `tool:${ToolId}` | 'undo' | 'redo' | 'delete' | 'cancel' | 'finish' | 'nudge' | 'fit' | 'zoom-in' | 'zoom-out';

export interface Shortcut {
	action: ShortcutAction;
	label: string;
	group: 'Tools' | 'Edit' | 'View';
	to: 'tool' | 'app';
	keys: KeyCombo[];
}

export const SHORTCUTS: readonly Shortcut[] = [
	...TOOL_LIST.map((t): Shortcut => ({ action: `tool:${t.id}`, label: t.label, group: 'Tools', to: 'app', keys: [{ key: t.key }] })),
	{ action: 'undo', label: 'Undo', group: 'Edit', to: 'app', keys: [{ key: 'z', mod: true }] },
	{ action: 'redo', label: 'Redo', group: 'Edit', to: 'app', keys: [{ key: 'z', mod: true, shift: true }, { key: 'y', ctrl: true }] },
	{ action: 'finish', label: 'Finish the outline or line', group: 'Edit', to: 'tool', keys: [{ key: 'Enter' }] },
	{ action: 'cancel', label: 'Cancel the drawing, or clear the selection', group: 'Edit', to: 'tool', keys: [{ key: 'Escape' }] },
	{ action: 'delete', label: 'Delete the selection (while drawing, Backspace takes back the last point)', group: 'Edit', to: 'tool', keys: [{ key: 'Delete' }, { key: 'Backspace' }] },
	{
		action: 'nudge',
		label: 'Nudge the selection 1 px (with Shift, 10 px)',
		group: 'Edit',
		to: 'tool',
		keys: ['ArrowLeft', 'ArrowRight', 'ArrowUp', 'ArrowDown'].map((key) => ({ key, shift: 'any' as const })),
	},
	{ action: 'fit', label: 'Fit the photo to the view', group: 'View', to: 'app', keys: [{ key: '0' }] },
	// '+' needs Shift on many layouts, and '=' is the same key unshifted.
	{ action: 'zoom-in', label: 'Zoom in', group: 'View', to: 'app', keys: [{ key: '+', shift: 'any' }, { key: '=', shift: 'any' }] },
	{ action: 'zoom-out', label: 'Zoom out', group: 'View', to: 'app', keys: [{ key: '-', shift: 'any' }] },
];

const norm = (key: string) => (key.length === 1 ? key.toLowerCase() : key);

export function matches(combo: KeyCombo, e: KeyInput): boolean {
	if (norm(combo.key) !== norm(e.key)) return false;
	const ctrl = !!e.ctrl;
	const meta = !!e.meta;
	if (combo.ctrl) {
		if (!ctrl || meta) return false;
	} else if (combo.mod) {
		if (ctrl === meta) return false; // exactly one of them
	} else if (ctrl || meta) return false;
	if (e.alt) return false;
	return combo.shift === 'any' || !!combo.shift === !!e.shift;
}

/** The shortcut a key press means, or null (then the key is not ours: leave it to the browser). */
export function matchShortcut(e: KeyInput): Shortcut | null {
	return SHORTCUTS.find((s) => s.keys.some((k) => matches(k, e))) ?? null;
}

const KEY_NAMES: Record<string, string> = { ArrowLeft: '←', ArrowRight: '→', ArrowUp: '↑', ArrowDown: '↓', Escape: 'Esc', Backspace: 'Backspace', Delete: 'Delete', Enter: 'Enter' };

/** A combination as the help panel writes it: "Ctrl+Shift+Z", or "⇧⌘Z" on a Mac. */
export function describeCombo(c: KeyCombo, mac: boolean): string {
	const key = KEY_NAMES[c.key] ?? (c.key.length === 1 ? c.key.toUpperCase() : c.key);
	const parts: string[] = [];
	if (c.ctrl) parts.push(mac ? '⌃' : 'Ctrl');
	else if (c.mod) parts.push(mac ? '⌘' : 'Ctrl');
	if (c.shift === true) parts.push(mac ? '⇧' : 'Shift');
	// The Mac writes modifiers as symbols run together, Shift before Command.
	return mac ? [...parts.filter((p) => p === '⌃' || p === '⇧'), ...parts.filter((p) => p === '⌘'), key].join('') : [...parts, key].join('+');
}
