import type { TreatmentBodyInput } from './schema.ts';
import type { TreatmentView } from './view.ts';

/**
 * The editable body of a treatment as the API shows it: what the editor starts from and sends
 * back. Values the server derives (cure periods, real strengths) are left out, since the server
 * recomputes them on every save.
 */
export type EditBody = {
	title: string;
	purpose: string;
	beforeCheckId: string | null;
	afterCheckId: string | null;
	steps: EditStep[];
	risk: TreatmentView['risk'];
};
export type EditStep = Omit<TreatmentView['steps'][number], 'materials'> & { materials: EditMaterial[] };
export type EditMaterial = Omit<TreatmentView['steps'][number]['materials'][number], 'cureHours' | 'fluid'> & {
	fluid: Omit<NonNullable<TreatmentView['steps'][number]['materials'][number]['fluid']>, 'realPercentVol'> | null;
};

export function bodyFromView(t: TreatmentView): EditBody {
	return structuredClone({
		title: t.title,
		purpose: t.purpose,
		beforeCheckId: t.beforeCheck?.id ?? null,
		afterCheckId: t.afterCheck?.id ?? null,
		steps: t.steps.map((s) => ({
			...s,
			materials: s.materials.map(({ cureHours: _derived, fluid, ...m }) => ({ ...m, fluid: fluid ? (({ realPercentVol: _real, ...f }) => f)(fluid) : null })),
		})),
		risk: t.risk,
	});
}

// The editor's body must stay acceptable to the API's schema.
export const asInput = (b: EditBody): TreatmentBodyInput => b;
