import { describe, expect, it } from 'vitest';
import { screenshotPath, signInAs, useBrowser } from '../helpers/browser.ts';

/** An administrator extends the damage vocabulary, the stores and the treatment materials. */
const browser = useBrowser();

describe('the Lists page', () => {
	it('adds a damage term, a storage location and a sealant', async () => {
		const page = await browser().newPage();
		await signInAs(page, 'admin', '/admin/lists');
		const term = `foxing ${Date.now() % 100000}`;
		await page.getByLabel('Part').selectOption('label');
		await page.getByLabel('New term').fill(term);
		await page.click('text=Add term');
		await page.waitForSelector(`text=${term} (added)`);
		const code = `B-${Date.now() % 100000}`;
		await page.getByLabel('Code').fill(code);
		await page.getByLabel('Name', { exact: true }).fill('Basement bay');
		await page.getByRole('button', { name: 'Add', exact: true }).click();
		await expect.poll(() => page.textContent('[data-testid=locations]')).toContain(code);
		// A sealant with its cure period, for the treatments' cure timers.
		const materials = page.locator('[data-testid=materials]');
		const sealant = `Test silicone ${Date.now() % 100000}`;
		await materials.getByLabel('Material name').fill(sealant);
		await materials.getByLabel('Cure (h)').fill('36');
		await materials.getByRole('button', { name: 'Add material' }).click();
		await expect.poll(() => materials.getByLabel(`Cure period of ${sealant}`).inputValue()).toBe('36');
		await page.screenshot({ path: screenshotPath('admin-lists'), fullPage: true });
		await page.close();
	});
});
