import { describe, expect, it } from 'vitest';
import { islandsReady, screenshotPath, signInAs, useBrowser } from '../helpers/browser.ts';

/**
 * A curator's home is the collection overview: she narrows it to one collection, follows a figure to
 * the register filtered to those jars, then opens the jar losing fluid fastest and reads its history
 * with its charts. An administrator sets a store's limits on the Lists page.
 */
const browser = useBrowser();

describe('the collection overview in a browser', () => {
	it('takes a curator from a figure to the filtered register, and from a jar to its history', async () => {
		const page = await browser().newPage();
		await signInAs(page, 'curator', '/');
		await page.waitForSelector('[data-testid=home-curator] [data-testid=figure-overdue]');
		await page.waitForSelector('[data-testid=airspace-row]');
		expect(await page.textContent('[data-testid=flammable-caution]')).toMatch(/Fire codes and building allowances are local/);
		expect(await page.locator('[data-testid=inventory-SPR-A1]').textContent()).toMatch(/Near the limit|Over the limit/);
		await page.screenshot({ path: screenshotPath('overview-curator'), fullPage: true });

		await page.getByLabel('Collection').selectOption('Comparative anatomy');
		await expect.poll(() => new URL(page.url()).searchParams.get('collection')).toBe('Comparative anatomy');
		await expect.poll(() => page.textContent('[aria-live=polite]')).toMatch(/^\d+ specimens · as of/);
		const overdue = Number((await page.locator('[data-testid=figure-overdue] .text-3xl').textContent())!.replace(/\D/g, ''));
		expect(overdue).toBeGreaterThan(0);
		await Promise.all([page.waitForURL(/\/specimens\?/), page.click('[data-testid=figure-overdue]')]);
		await islandsReady(page);
		const params = new URL(page.url()).searchParams;
		expect(params.get('department')).toBe('Comparative anatomy');
		expect(params.get('due')).toBe('overdue');
		await expect.poll(() => page.locator('[data-testid=register-row]').count()).toBe(overdue);
		expect(await page.textContent('[data-testid=filter-department]')).toMatch(/Comparative anatomy/);
		expect(await page.locator('#filter-due').inputValue()).toBe('overdue');
		await page.screenshot({ path: screenshotPath('overview-register'), fullPage: true });

		await page.goBack();
		await page.waitForSelector('[data-testid=loss-by-rate] [data-testid=loss-row]');
		const first = page.locator('[data-testid=loss-by-rate] [data-testid=loss-row] a').first();
		const objectNumber = (await first.textContent())!;
		await Promise.all([page.waitForURL(/\/specimens\/[0-9a-f-]{36}#history$/), first.click()]);
		await page.waitForSelector('[data-testid=chart-level] svg .recharts-line');
		expect(await page.textContent('[data-testid=object-number]')).toBe(objectNumber);
		expect(await page.textContent('[data-testid=summary-level]')).toMatch(/mm a year/);
		expect(await page.textContent('[data-testid=summary-level]')).toMatch(/At this rate the fluid reaches the top of the specimen in about/);
		await page.waitForSelector('[data-testid=chart-strength] svg');
		await page.waitForSelector('[data-testid=row-view-front] img');
		expect(await page.locator('[data-testid=across-checks] thead th').count()).toBeGreaterThanOrEqual(4);
		// Measured from the front photographs when they have a grey card, else said to be missing.
		expect(await page.locator('[data-testid=chart-yellowness], [data-testid=no-yellowness]').count()).toBe(1);
		await page.locator('#history').screenshot({ path: screenshotPath('specimen-history') });
		await page.close();
	});

	it('lets an administrator set a store’s limits, refusing a coolest above the warmest', async () => {
		const page = await browser().newPage();
		await signInAs(page, 'admin', '/admin/lists');
		const code = `LB-${Date.now() % 100000}`;
		await page.getByLabel('Code').fill(code);
		await page.getByLabel('Name', { exact: true }).fill('Limits bay');
		await page.getByRole('button', { name: 'Add', exact: true }).click();
		await page.waitForSelector(`[data-testid=location-${code}]`);
		await page.getByRole('button', { name: `Edit limits of ${code}` }).click();
		const form = page.getByRole('form', { name: `Limits of ${code}` });
		await form.getByLabel('Flammable limit (L)').fill('60');
		await form.getByLabel('Coolest (°C)').fill('24');
		await form.getByLabel('Warmest (°C)').fill('18');
		await form.getByRole('button', { name: 'Save limits' }).click();
		await expect.poll(() => form.getByRole('alert').textContent()).toMatch(/coolest temperature cannot be above the warmest/);
		await page.screenshot({ path: screenshotPath('admin-limits-refused'), fullPage: true });
		await form.getByLabel('Coolest (°C)').fill('14');
		await form.getByRole('button', { name: 'Save limits' }).click();
		await expect.poll(() => page.textContent(`[data-testid=location-${code}] [data-testid=limits]`)).toBe('flammable limit 60 L (near from 80 %); 14 to 18 °C');
		await page.screenshot({ path: screenshotPath('admin-limits'), fullPage: true });
		await page.close();
	});
});
