import { expect } from 'vitest';
import { call } from './server.ts';
import { specimenRecord } from './specimens.ts';

/** A condition check taken to "in review" over HTTP, as a conservator would (for mail tests). */
const empty = { grade: null, terms: [], note: '' };
export const gradedCheck = (notes = '') => ({
	checkedOn: '2026-11-20',
	reason: 'routine-survey',
	parts: {
		container: { grade: 'good', terms: [], note: '' },
		lid: empty,
		seal: { grade: 'fair', terms: [], note: '' },
		fluid: { grade: 'good', terms: [], note: '' },
		specimen: { grade: 'good', terms: [], note: '' },
		mount: empty,
		label: empty,
	},
	priority: 'routine',
	notes,
	fluid: null,
});

export async function newSpecimen(cookie: string, prefix: string): Promise<{ id: string; objectNumber: string }> {
	const res = await call('/api/specimens', { cookie, json: specimenRecord(prefix) });
	expect(res.status).toBe(201);
	const { specimen } = await res.json();
	return { id: specimen.id, objectNumber: specimen.objectNumber };
}

/** Opens a check on the specimen, grades it and submits it; returns the check as the API shows it. */
export async function submittedCheck(cookie: string, specimenId: string): Promise<{ id: string; version: number }> {
	const opened = await call(`/api/specimens/${specimenId}/checks`, { cookie, json: {} });
	expect(opened.status).toBe(201);
	const { check } = await opened.json();
	const put = await call(`/api/checks/${check.id}`, { cookie, method: 'PUT', json: { version: check.version, check: gradedCheck() } });
	expect(put.status).toBe(200);
	const saved = await put.json();
	const submitted = await call(`/api/checks/${check.id}/submit`, { cookie, json: { version: saved.check.version } });
	expect(submitted.status).toBe(200);
	return (await submitted.json()).check;
}
