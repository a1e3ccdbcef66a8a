import { beforeAll, describe, expect, it } from 'vitest';
import fs from 'node:fs';
import { QueryTypes } from 'sequelize';
import { call, useTestDatabase } from '../helpers/server.ts';
import { reportOf } from '../helpers/pdf.ts';
import { signedInUser } from '../helpers/users.ts';
import { gradedCheck, newSpecimen, submittedCheck } from '../helpers/checks.ts';
import { openCheck, uploadPhoto } from '../helpers/photos.ts';
import { db } from '../../src/lib/server/db.ts';
import { CHECK_LABELS, PARTS, type Grade, type Part } from '../../src/lib/check/vocabulary.ts';

/** The PDF condition report of a check: the showcase jar's newest check, with photos and marks, and a check with none. */
type Showcase = { id: string; checked_on: string; examiner: string; parts: Record<Part, { grade: Grade | null }>; fluid: { realPercentVol: number | null } | null; photos: number };

let viewer = '';
let showcase: Showcase;

const pdfOf = (id: string) => reportOf(id, viewer);

beforeAll(async () => {
	useTestDatabase();
	viewer = (await signedInUser('curator', 'report')).cookie;
	[showcase] = await db().query<Showcase>(
		`SELECT c.id, c.checked_on::text AS checked_on, u.name AS examiner, c.parts, c.fluid,
		        (SELECT count(*)::int FROM photos p WHERE p.check_id = c.id) AS photos
		   FROM condition_checks c JOIN specimens s ON s.id = c.specimen_id JOIN users u ON u.id = c.examiner_id
		  WHERE s.object_number = 'STC.1898.014' ORDER BY c.checked_on DESC LIMIT 1`,
		{ type: QueryTypes.SELECT },
	) as [Showcase];
});

describe('GET /api/checks/[id]/report.pdf', () => {
	it('prints the showcase check: details, every grade, the examiner, real strength, one page per photo, page N of M', async () => {
		expect(showcase.photos).toBeGreaterThan(0);
		const { res, bytes, pages, ms } = await pdfOf(showcase.id);
		console.log(`report of STC.1898.014 ${showcase.checked_on}: ${Math.round(ms)} ms, ${bytes.length} bytes, ${pages.length} pages`);
		expect(res.status).toBe(200);
		// Kept to look at, like the browser tests' screenshots (test-results/ is git-ignored).
		fs.mkdirSync('test-results', { recursive: true });
		fs.writeFileSync('test-results/report-showcase.pdf', bytes);
		expect(res.headers.get('content-type')).toBe('application/pdf');
		expect(res.headers.get('content-disposition')).toContain(`filename="STC.1898.014-condition-${showcase.checked_on}.pdf"`);
		expect(new TextDecoder().decode(bytes.slice(0, 5))).toBe('%PDF-');
		const all = pages.join('\n');
		expect(all).toContain('STC.1898.014');
		expect(all).toContain(showcase.examiner);
		for (const part of PARTS) {
			const g = showcase.parts[part].grade;
			expect(all).toContain(g ? CHECK_LABELS.grade[g] : 'Not graded');
		}
		expect(showcase.fluid?.realPercentVol).not.toBeNull();
		expect(all).toContain(`${showcase.fluid!.realPercentVol!.toFixed(1)} % vol`);
		expect(all).toContain('qualified practice govern');
		// The content rules: the text sections, then one page per photograph.
		const photoPages = pages.filter((p) => /Photograph: /.test(p)).length;
		expect(photoPages).toBe(showcase.photos);
		expect(pages.length).toBeGreaterThanOrEqual(2);
		expect(pages.length).toBeGreaterThan(showcase.photos);
		pages.forEach((p, i) => {
			expect(p).toContain(`Page ${i + 1} of ${pages.length}`);
			expect(p).toContain(`Meniscus · STC.1898.014 · check of ${showcase.checked_on}`);
		});
		const [audited] = await db().query<{ n: number }>(`SELECT count(*)::int AS n FROM audit_events WHERE action = 'check.report-downloaded' AND entity_id = :id`, {
			replacements: { id: showcase.id },
			type: QueryTypes.SELECT,
		});
		expect(audited!.n).toBeGreaterThan(0);
	});

	it('a check with no photographs still yields a valid PDF that says so', async () => {
		const conservator = await signedInUser('conservator', 'report');
		const specimen = await newSpecimen(conservator.cookie, 'RPT');
		const check = await submittedCheck(conservator.cookie, specimen.id);
		const { res, bytes, pages } = await pdfOf(check.id);
		expect(res.status).toBe(200);
		expect(new TextDecoder().decode(bytes.slice(0, 5))).toBe('%PDF-');
		const all = pages.join('\n');
		expect(all).toContain(specimen.objectNumber);
		expect(all).toContain('No photographs were taken for this check.');
		expect(all).toContain('Not yet reviewed');
	});

	it('takes the changes since the previous check from a saved comparison when there is one', async () => {
		const conservator = await signedInUser('conservator', 'report-cmp');
		const specimen = await newSpecimen(conservator.cookie, 'RPC');
		const earlier = await openCheck(conservator.cookie, specimen.id);
		const put = await call(`/api/checks/${earlier.id}`, { cookie: conservator.cookie, method: 'PUT', json: { version: earlier.version, check: { ...gradedCheck(), checkedOn: '2025-06-01' } } });
		expect(put.status).toBe(200);
		const later = await openCheck(conservator.cookie, specimen.id);
		const [before, after] = await Promise.all([uploadPhoto(conservator.cookie, specimen.id, 'before.jpg', earlier.id), uploadPhoto(conservator.cookie, specimen.id, 'after.jpg', later.id)]);
		const unsaved = (await pdfOf(later.id)).pages.join('\n');
		expect(unsaved).toContain('No comparison has been saved for these photographs.');
		const saved = await call(`/api/specimens/${specimen.id}/comparisons`, { cookie: conservator.cookie, json: { beforePhotoId: before, afterPhotoId: after, model: 'none', controlPoints: [], note: '' } });
		expect(saved.status).toBe(201);
		const text = (await pdfOf(later.id)).pages.join('\n');
		expect(text).toContain('Compared with the check of 2025-06-01.');
		expect(text).toContain('From the saved comparison.');
	});

	it('refuses the signed-out (401) and answers 404 for an unknown check', async () => {
		expect((await call(`/api/checks/${showcase.id}/report.pdf`)).status).toBe(401);
		expect((await pdfOf('00000000-0000-4000-8000-000000000000')).res.status).toBe(404);
		expect((await pdfOf('not-a-uuid')).res.status).toBe(404);
	});
});
