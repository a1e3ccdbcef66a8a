import { call } from './server.ts';
import { specimenRecord } from './specimens.ts';
import { gradedCheck } from './checks.ts';
import { bodyOf } from './treatments.ts';
import type { Person, World } from './world.ts';

/**
 * A body each record-writing route accepts as it stands, against a World's records (read fresh, so
 * versions are current). The hostile-input tests change one thing in it, so a refusal is that
 * change's doing. `inner` names the record inside the body, if there is one.
 */
export interface ValidWrite {
	name: string;
	method: string;
	path: string;
	who: Person;
	body: () => Promise<Record<string, unknown>>;
	inner?: string;
}

const json = async (path: string, cookie: string) => (await call(path, { cookie })).json();

export function validWrites(w: World): ValidWrite[] {
	const checkVersion = async () => (await json(`/api/checks/${w.checkId}`, w.a.cookie)).check.version;
	return [
		{ name: 'saving a check', method: 'PUT', path: `/api/checks/${w.checkId}`, who: w.a, body: async () => ({ version: await checkVersion(), check: gradedCheck('Seal sound.') }), inner: 'check' },
		{ name: 'opening a check', method: 'POST', path: `/api/specimens/${w.specimenId}/checks`, who: w.b, body: async () => ({}) },
		{ name: 'submitting a check', method: 'POST', path: `/api/checks/${w.checkId}/submit`, who: w.a, body: async () => ({ version: await checkVersion() }) },
		{ name: 'reviewing a check', method: 'POST', path: `/api/checks/${w.checkId}/review`, who: w.reviewer, body: async () => ({ decision: 'approve', comment: '' }) },
		{
			name: 'editing a specimen',
			method: 'PUT',
			path: `/api/specimens/${w.specimenId}`,
			who: w.b,
			body: async () => ({ version: (await json(`/api/specimens/${w.specimenId}`, w.a.cookie)).specimen.version, record: specimenRecord('x', { objectNumber: w.objectNumber }) }),
			inner: 'record',
		},
		{ name: 'registering a specimen', method: 'POST', path: '/api/specimens', who: w.b, body: async () => specimenRecord(`VALID.${process.pid}`) },
		{
			name: 'saving a comparison',
			method: 'PUT',
			path: `/api/comparisons/${w.comparisonId}`,
			who: w.b,
			body: async () => ({
				version: (await json(`/api/comparisons/${w.comparisonId}`, w.a.cookie)).comparison.version,
				comparison: { beforePhotoId: w.photoId, afterPhotoId: w.specimenPhotoId, model: 'none', controlPoints: [], note: 'Rechecked.' },
			}),
			inner: 'comparison',
		},
		{
			name: 'saving a mark layer',
			method: 'PUT',
			path: `/api/photos/${w.photoId}/marks`,
			who: w.b,
			body: async () => {
				const { version, layer } = await json(`/api/photos/${w.photoId}/marks`, w.b.cookie);
				return { version, layer };
			},
			inner: 'layer',
		},
		{ name: 'changing one’s mail settings', method: 'PATCH', path: '/api/me/mail-preferences', who: w.b, body: async () => ({ checkSubmitted: false }) },
		{
			name: 'saving a treatment',
			method: 'PUT',
			path: `/api/treatments/${w.treatmentId}`,
			who: w.a,
			body: async () => {
				const { treatment } = await json(`/api/treatments/${w.treatmentId}`, w.a.cookie);
				return { version: treatment.version, treatment: bodyOf(treatment) };
			},
			inner: 'treatment',
		},
		{ name: 'opening a treatment', method: 'POST', path: `/api/specimens/${w.specimenId}/treatments`, who: w.b, body: async () => ({ title: 'Reseal', purpose: '' }) },
		{ name: 'changing a material', method: 'PATCH', path: `/api/treatment-materials/${w.materialId}`, who: w.admin, body: async () => ({ note: 'Linen, waxed.' }) },
		{ name: 'changing a store’s limits', method: 'PATCH', path: `/api/locations/${w.locationId}`, who: w.admin, body: async () => ({ nearLimitPercent: 75 }) },
	];
}
