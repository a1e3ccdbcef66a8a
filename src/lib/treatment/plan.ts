import type { SealType } from '../specimen/vocabulary.ts';
import { STEP_KIND_INFO, TEMPLATE_STEPS, type StepKind } from './vocabulary.ts';

/**
 * The starting plan of a new treatment: the trade's re-jarring outline as steps, with the note on
 * opening the seal that fits the jar's recorded seal. Every step starts planned; the conservator
 * removes, renames, reorders and adds steps.
 */
export interface TemplateStep {
	id: string;
	kind: StepKind;
	title: string;
	status: 'planned';
	notes: string;
	materials: [];
	doneBy: null;
	startedAt: null;
	finishedAt: null;
	minutes: null;
}

const OPENING: Record<SealType, string> = {
	silicone: 'Silicone seal: shave it off with a blade.',
	pitch: 'Pitch or bitumen seal: soften it with gentle heat; it may be coal-tar pitch.',
	wax: 'Wax seal: soften it with gentle heat.',
	gasket: 'Gasket: release the closure and lift the gasket out.',
	unknown: 'Seal not identified: find out what it is before applying heat or solvent.',
};

export function templatePlan(sealType: SealType, newId: () => string): TemplateStep[] {
	return TEMPLATE_STEPS.map((kind) => ({
		id: newId(),
		kind,
		title: STEP_KIND_INFO[kind].title,
		status: 'planned',
		notes: kind === 'open-seal' ? OPENING[sealType] : '',
		materials: [],
		doneBy: null,
		startedAt: null,
		finishedAt: null,
		minutes: null,
	}));
}

/** A short id for a new step or hazard (unique within its treatment, not a secret). */
export function shortId(random: () => number = Math.random): string {
	let s = '';
	for (let i = 0; i < 10; i++) s += 'abcdefghijklmnopqrstuvwxyz0123456789'[Math.floor(random() * 36)];
	return s;
}
