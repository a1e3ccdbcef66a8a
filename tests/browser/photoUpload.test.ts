import { describe, expect, it } from 'vitest';
import { screenshotPath, signInAs, useBrowser } from '../helpers/browser.ts';
import { signIn } from '../helpers/server.ts';
import { makeSpecimen, openCheck, sampleJpeg } from '../helpers/photos.ts';

/**
 * A conservator drops three photographs on a check: the uploader shows each file's progress and
 * the total, the server checks each one, and their thumbnails appear in the check's photographs.
 */
const browser = useBrowser();

describe('photographs on a condition check', () => {
	it('go from the drop area to thumbnails', async () => {
		const cookie = await signIn('conservator@example.org');
		const specimenId = await makeSpecimen(cookie, 'BRW');
		const check = await openCheck(cookie, specimenId);
		const page = await browser().newPage();
		const errors: string[] = [];
		page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
		await signInAs(page, 'conservator', `/checks/${check.id}`);
		await page.getByText('No photographs yet').waitFor();

		const files = await Promise.all(
			['front', 'left', 'lid'].map(async (name, i) => ({ name: `BRW-${name}.jpg`, mimeType: 'image/jpeg', buffer: await sampleJpeg(1200 + i * 100, 900) })),
		);
		// Dropped as a browser drops files: a DataTransfer on the Dashboard's drop area.
		const handle = await page.evaluateHandle(
			(fs) => {
				const dt = new DataTransfer();
				for (const f of fs) dt.items.add(new File([Uint8Array.from(atob(f.b64), (c) => c.charCodeAt(0))], f.name, { type: f.mimeType }));
				return dt;
			},
			files.map((f) => ({ name: f.name, mimeType: f.mimeType, b64: f.buffer.toString('base64') })),
		);
		await page.dispatchEvent('.uppy-Dashboard-inner', 'dragover', { dataTransfer: handle });
		await page.dispatchEvent('.uppy-Dashboard-inner', 'drop', { dataTransfer: handle });
		await page.getByText('3 files selected').waitFor();
		await page.screenshot({ path: screenshotPath('photos-selected'), fullPage: true });
		await page.locator('.uppy-StatusBar-actionBtn--upload').click();
		// The verdicts arrive per file, then the thumbnails.
		await expect.poll(() => page.locator('[aria-label="What the server made of each upload"] li').filter({ hasText: 'Recorded' }).count(), { timeout: 30_000 }).toBe(3);
		await expect.poll(() => page.locator('ul[aria-label=Photographs] img').count(), { timeout: 15_000 }).toBe(3);
		await expect.poll(() => page.locator('ul[aria-label=Photographs] img').evaluateAll((imgs) => imgs.every((i) => (i as HTMLImageElement).naturalWidth > 0))).toBe(true);
		await page.screenshot({ path: screenshotPath('photos-recorded'), fullPage: true });

		// The photo page shows the hash and zooms through the tiles.
		await page.locator('ul[aria-label=Photographs] a').first().click();
		await page.getByText('SHA-256', { exact: true }).waitFor();
		await page.getByRole('button', { name: 'Zoom to full resolution' }).click();
		await expect.poll(() => page.locator('[aria-label$="zoomable"] img').count()).toBeGreaterThan(0);
		await page.screenshot({ path: screenshotPath('photo-page'), fullPage: true });
		expect(errors.filter((e) => !/favicon/.test(e))).toEqual([]);
	});

	it('are matched to specimens by the object numbers in their file names when dropped on the register', async () => {
		const page = await browser().newPage();
		await signInAs(page, 'conservator', '/specimens');
		await page.getByText('Add photographs of many specimens at once').click();
		const files = await Promise.all(['STC.1898.014 front.jpg', 'stc-1902-003_lid.jpg', 'IMG_0001.jpg'].map(async (name) => ({ name, mimeType: 'image/jpeg', buffer: await sampleJpeg(800, 600) })));
		await page.getByLabel('Photographs to match').setInputFiles(files);
		const table = page.getByRole('table', { name: 'Matches to confirm' });
		await expect.poll(() => table.locator('tbody tr').count()).toBe(3);
		await expect.poll(() => table.locator('tbody tr').nth(0).textContent()).toMatch(/STC\.1898\.014/);
		await expect.poll(() => table.locator('tbody tr').nth(1).textContent()).toMatch(/STC\.1902\.003/);
		await expect.poll(() => table.locator('tbody tr').nth(2).textContent()).toMatch(/No object number found/);
		await page.screenshot({ path: screenshotPath('photos-batch-matches'), fullPage: true });
		await table.locator('tbody tr').nth(2).getByLabel('Find the specimen').fill('STC.1902.017');
		await table.locator('tbody tr').nth(2).getByRole('button', { name: /STC\.1902\.017/ }).click();
		await page.getByRole('button', { name: 'Upload 3 confirmed photographs' }).click();
		await expect.poll(() => page.locator('[aria-label="What the server made of each upload"] li').filter({ hasText: 'Recorded' }).count(), { timeout: 30_000 }).toBe(3);
		await page.screenshot({ path: screenshotPath('photos-batch-done'), fullPage: true });
	});

	it('are still listed after the tab is reloaded before they were sent', async () => {
		const cookie = await signIn('conservator@example.org');
		const check = await openCheck(cookie, await makeSpecimen(cookie, 'BRR'));
		const page = await browser().newPage();
		await signInAs(page, 'conservator', `/checks/${check.id}`);
		await page.getByText('No photographs yet').waitFor();
		await page.locator('.uppy-Dashboard-input').first().setInputFiles([{ name: 'BRR-restore.jpg', mimeType: 'image/jpeg', buffer: await sampleJpeg(640, 480) }]);
		await page.getByText('1 file selected').waitFor();
		// Golden Retriever writes the state as it changes; give it a moment, then lose the tab's memory.
		await page.waitForTimeout(1500);
		await page.reload();
		await page.getByText('BRR-restore.jpg').waitFor({ timeout: 15_000 });
		await page.locator('.uppy-StatusBar-actionBtn--upload').click();
		await expect.poll(() => page.locator('ul[aria-label=Photographs] img').count(), { timeout: 30_000 }).toBe(1);
	});
});
