import { extractText, getDocumentProxy } from 'unpdf';
import { beforeAll, describe, expect, it } from 'vitest';
import { call, useTestDatabase } from '../helpers/server.ts';
import { signedInUser } from '../helpers/users.ts';
import { gradedCheck } from '../helpers/checks.ts';
import { specimenRecord } from '../helpers/specimens.ts';
import { openCheck } from '../helpers/photos.ts';

/**
 * TESTPLAN B6, the PDF report (ASVS 5.0 1.3.7 no template injection, 1.2.x output encoding):
 * template, markup and PDF-operator syntax typed into every free-text field the condition report
 * prints comes out of the PDF as the same text, unevaluated and whole (text read back with unpdf).
 */
const PAYLOADS = ['{{7*7}}', '${7*7}', '<%= 7*7 %>', '#{7*7}', '<script>alert(1)</script>', ') Tj ET BT (', '%PDF-1.7 endobj', '\\(x\\)'];
let cookie: string;
let checkId: string;

beforeAll(async () => {
	useTestDatabase();
	({ cookie } = await signedInUser('conservator', 'pdfi'));
	const record = specimenRecord(`PDFI.${process.pid}`, { title: `Newt ${PAYLOADS[0]} ${PAYLOADS[4]}`, hazards: [{ flag: 'flammable-spirit', note: PAYLOADS[1] }] });
	const made = await call('/api/specimens', { cookie, json: record });
	expect(made.status).toBe(201);
	const check = await openCheck(cookie, (await made.json()).specimen.id);
	const body = gradedCheck(PAYLOADS.join(' | '));
	body.parts.container.note = PAYLOADS[2]!;
	body.parts.seal.note = PAYLOADS[5]!;
	const put = await call(`/api/checks/${check.id}`, { method: 'PUT', cookie, json: { version: check.version, check: body } });
	expect(put.status, await put.clone().text()).toBe(200);
	checkId = check.id;
});

describe('template and markup syntax in the condition report', () => {
	it('is printed as the very text that was typed, in the title, a hazard note, part notes and the notes', async () => {
		const res = await call(`/api/checks/${checkId}/report.pdf`, { cookie });
		expect(res.status).toBe(200);
		const { text } = await extractText(await getDocumentProxy(new Uint8Array(await res.arrayBuffer())), { mergePages: true });
		// Line wrapping may break a line anywhere there is a space; compare with spaces evened out.
		const flat = (text as string).replace(/\s+/g, ' ');
		for (const p of PAYLOADS) expect(flat, p).toContain(p);
		expect(flat).toContain(`Newt ${PAYLOADS[0]} ${PAYLOADS[4]}`);
	});
});
