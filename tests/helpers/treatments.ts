import { expect } from 'vitest';
import { call } from './server.ts';
import type { TreatmentView } from '../../src/lib/treatment/view.ts';
import { bodyFromView, type EditBody } from '../../src/lib/treatment/edit.ts';

/** Treatments over HTTP, as the editor does: open, send the whole record back with changes, act. */
export async function openTreatment(cookie: string, specimenId: string, over: Record<string, unknown> = {}): Promise<TreatmentView> {
	const res = await call(`/api/specimens/${specimenId}/treatments`, { cookie, json: { title: 'Re-jar and reseal', purpose: 'Seal failed; fluid low.', ...over } });
	expect(res.status).toBe(201);
	return (await res.json()).treatment;
}

/** The body the editor would send for `t`, with `change` applied to a copy. */
export function bodyOf(t: TreatmentView, change: (b: EditBody) => void = () => {}): EditBody {
	const b = bodyFromView(t);
	change(b);
	return b;
}

export const saveTreatment = (cookie: string, t: TreatmentView, body: unknown) => call(`/api/treatments/${t.id}`, { cookie, method: 'PUT', json: { version: t.version, treatment: body } });

/** An assessment that covers every hazard the record suggests, each with a control and a lower residual. */
export function coveringRisk(t: TreatmentView): EditBody['risk'] {
	return {
		hazards: t.suggested.map((h, i) => ({
			id: `h${i}`,
			kind: h.kind,
			description: h.reason,
			inherent: { likelihood: 3, severity: 4 },
			controls: h.kind === 'glass' ? ['gloves-cut', 'eye-protection'] : ['lev', 'no-ignition'],
			otherControls: '',
			residual: { likelihood: 2, severity: 3 },
		})),
		dismissed: [],
		notes: '',
	};
}
