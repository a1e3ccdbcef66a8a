import { describe, expect, inject, it } from 'vitest';
import { islandsReady, screenshotPath, useBrowser } from '../helpers/browser.ts';

/** A conservator uses the Fluid tools page: the strength correction and the top-up. */
const browser = useBrowser();
const base = () => inject('baseUrl');

describe('the Fluid tools page', () => {
	it('corrects a meter reading and explains a top-up that cannot be done by adding', async () => {
		const page = await browser().newPage();
		await page.goto(`${base()}/login?next=/fluid`);
		await page.fill('#email', 'conservator@example.org');
		await page.fill('#password', inject('demoPassword'));
		await Promise.all([page.waitForURL(/\/fluid$/), page.click('button[type=submit]')]);
		await page.waitForSelector('text=Alcohol meters read true only in ethanol–water');
		await islandsReady(page);

		const strength = page.locator('[data-testid=strength]');
		await strength.getByLabel('Meter reading').fill('66');
		await strength.getByLabel('Sample temperature').fill('6');
		await strength.getByRole('button', { name: 'Calculate' }).click();
		// METAS / EC practical tables: 66 % vol read at 6 °C is 70.6 % vol real.
		await expect.poll(() => strength.locator('[data-testid=answer]').textContent()).toMatch(/Real strength: 70\.6 % vol at 20 °C/);

		await strength.getByLabel('Sample temperature').fill('55');
		await strength.getByRole('button', { name: 'Calculate' }).click();
		await expect.poll(() => strength.getByRole('alert').textContent()).toMatch(/between -20 and \+40 °C/);

		const topup = page.locator('[data-testid=topup]');
		await topup.getByLabel('Its strength').fill('80');
		await topup.getByLabel('Fluid left in the jar').fill('950');
		await topup.getByRole('button', { name: 'Calculate' }).click();
		await expect.poll(() => topup.locator('[data-testid=answer]').textContent()).toMatch(/Adding alone cannot do this/);

		await page.locator('[data-testid=jar]').getByRole('button', { name: 'Calculate' }).click();
		await expect.poll(() => page.locator('[data-testid=jar] [data-testid=answer]').textContent()).toMatch(/Fill to at most \d+ mm/);
		await page.screenshot({ path: screenshotPath('fluid-tools'), fullPage: true });
		await page.close();
	});
});
