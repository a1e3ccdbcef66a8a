import type { ChangeClass } from './changes.ts';

/**
 * How each kind of change is shown, on the photo and in the list: a colour, a letter so colour is
 * never the only cue, a dash for what has gone, and words. Our own choice of colours, picked to be
 * told apart by people with the common colour-vision deficiencies (red and orange also differ in
 * lightness; resolved is dashed grey).
 */
export const CHANGE_STYLE: Record<ChangeClass, { colour: string; letter: string; dash: number[]; width: number; label: string }> = {
	new: { colour: '#e0282e', letter: 'N', dash: [], width: 4, label: 'new' },
	grown: { colour: '#ff9f1c', letter: 'G', dash: [], width: 4, label: 'grown' },
	shrunk: { colour: '#2ec4b6', letter: 'S', dash: [], width: 3, label: 'shrunk' },
	resolved: { colour: '#c9d1d9', letter: 'R', dash: [10, 7], width: 3, label: 'resolved' },
	unchanged: { colour: '#ffffff', letter: 'U', dash: [], width: 1.5, label: 'unchanged' },
};
