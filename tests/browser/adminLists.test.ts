import { describe, expect, it } from 'vitest';
import { screenshotPath, signInAs, useBrowser } from '../helpers/browser.ts';

/** An administrator extends the damage vocabulary; the term is offered in condition checks. */
const browser = useBrowser();

describe('the Lists page', () => {
	it('adds a damage term and a storage location', async () => {
		const page = await browser().newPage();
		await signInAs(page, 'admin', '/admin/lists');
		const term = `foxing ${Date.now() % 100000}`;
		await page.getByLabel('Part').selectOption('label');
		await page.getByLabel('New term').fill(term);
		await page.click('text=Add term');
		await page.waitForSelector(`text=${term} (added)`);
		const code = `B-${Date.now() % 100000}`;
		await page.getByLabel('Code').fill(code);
		await page.getByLabel('Name').fill('Basement bay');
		await page.getByRole('button', { name: 'Add', exact: true }).click();
		await expect.poll(() => page.textContent('[data-testid=locations]')).toContain(code);
		await page.screenshot({ path: screenshotPath('admin-lists'), fullPage: true });
		await page.close();
	});
});
