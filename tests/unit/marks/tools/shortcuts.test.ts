import { describe, expect, it } from 'vitest';
import { TOOL_IDS } from '../../../../src/lib/marks/tools/effects.ts';
import type { KeyInput } from '../../../../src/lib/marks/tools/events.ts';
import { TOOL_LIST } from '../../../../src/lib/marks/tools/index.ts';
import { describeCombo, matches, matchShortcut, SHORTCUTS } from '../../../../src/lib/marks/tools/shortcuts.ts';

const press = (key: string, mods: Omit<KeyInput, 'type' | 'key'> = {}): KeyInput => ({ type: 'key', key, ...mods });
const action = (key: string, mods: Omit<KeyInput, 'type' | 'key'> = {}) => matchShortcut(press(key, mods))?.action ?? null;

describe('shortcuts', () => {
	it('gives every tool a label and its own key', () => {
		expect(TOOL_LIST.map((t) => t.id)).toEqual([...TOOL_IDS]);
		expect(new Set(TOOL_LIST.map((t) => t.key)).size).toBe(TOOL_LIST.length);
		for (const t of TOOL_LIST) expect(action(t.key)).toBe(`tool:${t.id}`);
		expect(action('O', { shift: true })).toBeNull();
		expect(action('o', { ctrl: true })).toBeNull();
	});

	it('undoes with Ctrl/⌘+Z and redoes with Ctrl/⌘+Shift+Z or Ctrl+Y', () => {
		expect(action('z', { ctrl: true })).toBe('undo');
		expect(action('z', { meta: true })).toBe('undo');
		expect(action('Z', { ctrl: true, shift: true })).toBe('redo');
		expect(action('Z', { meta: true, shift: true })).toBe('redo');
		expect(action('y', { ctrl: true })).toBe('redo');
		expect(action('y', { meta: true })).toBeNull();
		expect(action('z', { ctrl: true, meta: true })).toBeNull();
	});

	it('passes editing keys to the tool and keeps view keys for the island', () => {
		expect(matchShortcut(press('Delete'))).toMatchObject({ action: 'delete', to: 'tool' });
		expect(matchShortcut(press('Backspace'))).toMatchObject({ action: 'delete', to: 'tool' });
		expect(matchShortcut(press('Escape'))).toMatchObject({ action: 'cancel', to: 'tool' });
		expect(matchShortcut(press('Enter'))).toMatchObject({ action: 'finish', to: 'tool' });
		expect(matchShortcut(press('ArrowUp', { shift: true }))).toMatchObject({ action: 'nudge', to: 'tool' });
		expect(matchShortcut(press('0'))).toMatchObject({ action: 'fit', to: 'app' });
		expect(action('+', { shift: true })).toBe('zoom-in');
		expect(action('=')).toBe('zoom-in');
		expect(action('-')).toBe('zoom-out');
	});

	it('has no combination that means two things', () => {
		const combos = SHORTCUTS.flatMap((s) => s.keys.map((k) => ({ s, k })));
		for (const { s, k } of combos) {
			const shifts = k.shift === 'any' ? [false, true] : [!!k.shift];
			for (const shift of shifts) {
				const e = press(k.key, { shift, ctrl: !!(k.ctrl || k.mod) });
				expect(SHORTCUTS.filter((o) => o.keys.some((c) => matches(c, e))).map((o) => o.action)).toEqual([s.action]);
			}
		}
	});

	it('writes combinations for the help panel, the Mac way on a Mac', () => {
		const redo = SHORTCUTS.find((s) => s.action === 'redo')!;
		expect(redo.keys.map((k) => describeCombo(k, false))).toEqual(['Ctrl+Shift+Z', 'Ctrl+Y']);
		expect(redo.keys.map((k) => describeCombo(k, true))).toEqual(['⇧⌘Z', '⌃Y']);
		expect(describeCombo({ key: 'ArrowLeft', shift: 'any' }, false)).toBe('←');
	});
});
