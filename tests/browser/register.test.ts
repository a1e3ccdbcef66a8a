import { describe, expect, it } from 'vitest';
import { screenshotPath, signInAs, useBrowser } from '../helpers/browser.ts';

/** A conservator registers and edits a jar; a curator finds it in the register. */
const browser = useBrowser();
const number = `BR.${process.pid}.${Date.now() % 100000}`;


describe('the register in a browser', () => {
	it('registers, edits and finds a specimen', async () => {
		const page = await browser().newPage();
		await signInAs(page, 'conservator@example.org', '/specimens/new');
		await page.getByLabel('Object number').fill(number);
		await page.getByLabel('Title').fill('Browser axolotl, whole');
		await page.getByLabel('Shape').selectOption('oval');
		await page.getByLabel('Major axis (inside) (mm)').fill('120');
		await page.getByLabel('Inner height to the lid (mm)').fill('180');
		// The minor axis is missing: the form says so next to the field and sends nothing.
		await page.click('text=Register the specimen');
		await expect.poll(() => page.locator('#f-innerDepthMm-note').textContent()).toMatch(/second inner dimension/);
		await page.getByLabel('Minor axis (inside) (mm)').fill('80');
		await page.getByLabel('Storage location').selectOption({ label: 'SPR-A1 — Spirit store A, bay 1' });
		await page.getByRole('checkbox', { name: 'Flammable spirit' }).check();
		await Promise.all([page.waitForURL(/\/specimens\/[0-9a-f-]{36}\?saved=1$/), page.click('text=Register the specimen')]);
		await expect.poll(() => page.textContent('[data-testid=object-number]')).toBe(number);
		await page.waitForSelector('text=Hazards recorded for this jar');
		await page.waitForSelector('text=registered the specimen');

		await page.click('text=Edit the record');
		await page.waitForSelector('#f-title');
		expect(await page.getByLabel('Storage location').inputValue()).not.toBe('');
		await page.getByLabel('Title').fill('Browser axolotl, whole, gills intact');
		await Promise.all([page.waitForURL(/\?saved=1$/), page.click('text=Save changes')]);
		await page.waitForSelector('text=edited the record');
		await page.screenshot({ path: screenshotPath('specimen-detail'), fullPage: true });

		await signInAs(page, 'curator@example.org', '/specimens');
		await page.getByLabel('Search').fill(number);
		await expect.poll(() => page.locator('[data-testid=register-row]').count()).toBe(1);
		expect(new URL(page.url()).searchParams.get('q')).toBe(number);
		await expect.poll(() => page.locator('[data-testid=register-row]').first().textContent()).toMatch(/gills intact/);
		expect(await page.locator('text=Register a specimen').count()).toBe(0);
		await page.getByLabel('Search').fill('');
		await page.locator('#filter-preservative').selectOption('formalin');
		// The search clears after a pause in typing; then every row shown is a formalin jar.
		await expect.poll(() => new URL(page.url()).searchParams.get('q')).toBeNull();
		await expect.poll(() => page.locator('[data-testid=register-row]').count()).toBeGreaterThanOrEqual(6);
		for (const row of await page.locator('[data-testid=register-row]').all()) expect(await row.textContent()).toMatch(/Formalin/);
		await page.screenshot({ path: screenshotPath('register'), fullPage: true });
		await page.close();
	});
});
