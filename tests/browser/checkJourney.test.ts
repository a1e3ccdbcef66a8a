import { describe, expect, inject, it } from 'vitest';
import { screenshotPath, signInAs, useBrowser } from '../helpers/browser.ts';

/**
 * The whole life of a condition check in a browser: a conservator registers a jar, opens a check,
 * grades it and reads the fluid, submits; a reviewer returns it; the conservator fixes and
 * resubmits; the reviewer approves; a curator sees the new condition on the record and in the register.
 */
const browser = useBrowser();
const base = () => inject('baseUrl');
const number = `JN.${process.pid}.${Date.now() % 100000}`;


describe('a condition check from opening to approval', () => {
	it('passes between conservator, reviewer and curator', async () => {
		const page = await browser().newPage();
		await signInAs(page, 'conservator', '/specimens/new');
		await page.getByLabel('Object number').fill(number);
		await page.getByLabel('Title').fill('Journey frog, dissected');
		await page.getByLabel('Inner diameter (mm)').fill('90');
		await page.getByLabel('Inner height to the lid (mm)').fill('180');
		await Promise.all([page.waitForURL(/\/specimens\/[0-9a-f-]{36}\?saved=1$/), page.click('text=Register the specimen')]);
		const specimenUrl = page.url().replace(/\?saved=1$/, '');

		await Promise.all([page.waitForURL(/\/checks\/[0-9a-f-]{36}$/), page.click('text=Open a condition check')]);
		const checkPath = new URL(page.url()).pathname;
		await page.locator('[data-testid=part-seal]').getByRole('radio', { name: 'Poor' }).click();
		await page.locator('[data-testid=part-seal]').getByLabel('cracked').check();
		await page.locator('[data-testid=part-container]').getByRole('radio', { name: 'Good' }).click();
		await page.locator('[data-testid=part-fluid]').getByRole('radio', { name: 'Fair' }).click();
		await expect.poll(() => page.textContent('[data-testid=overall]')).toMatch(/Poor/);
		await page.getByLabel('Alcohol meter reading').fill('70');
		await page.getByLabel('Sample temperature').fill('25');
		await expect.poll(() => page.textContent('[data-testid=real-strength]')).toMatch(/Real strength: 68\.4 % vol/);
		await page.getByLabel('Treatment priority').selectOption('high');
		// A pH of 15 is refused beside its field, before anything is sent.
		await page.getByLabel('pH', { exact: true }).fill('15');
		await page.click('text=Save draft');
		await expect.poll(() => page.locator('#fl-pH').locator('xpath=../..').textContent()).toMatch(/pH is between 0 and 14/);
		await page.getByLabel('pH', { exact: true }).fill('');
		await page.click('text=Submit for review');
		await expect.poll(() => page.textContent('[data-testid=check-header]')).toMatch(/In review/);
		await page.screenshot({ path: screenshotPath('check-submitted'), fullPage: true });

		await signInAs(page, 'reviewer', '/');
		await page.locator('[data-testid=review-queue]').getByText(number).click();
		await page.waitForURL((u) => u.pathname === checkPath);
		await page.getByLabel('Comment (needed to return the check)').fill('Please record the fluid level from the inner base.');
		await page.click('text=Return with comment');
		await expect.poll(() => page.textContent('[data-testid=check-header]')).toMatch(/Returned/);

		await signInAs(page, 'conservator', '/');
		await page.locator('[data-testid=checks-mine]').getByText(number).click();
		await page.waitForSelector('text=Please record the fluid level from the inner base.');
		await page.getByLabel('Fluid level above the inner base').fill('151');
		await page.click('text=Submit for review');
		await expect.poll(async () => `${await page.textContent('[data-testid=check-header]')} ${(await page.locator('[role=alert]').allTextContents()).join(' ')}`).toMatch(/In review/);

		await signInAs(page, 'reviewer', checkPath);
		await page.click('text=Approve');
		await expect.poll(() => page.textContent('[data-testid=check-header]')).toMatch(/Approved/);
		// Approved is final: no editing controls, for anyone.
		expect(await page.locator('text=Save draft').count()).toBe(0);

		await signInAs(page, 'curator', new URL(specimenUrl).pathname);
		await expect.poll(() => page.textContent('[data-testid=current-condition]')).toMatch(/Poor.*priority high/);
		await page.waitForSelector('[data-testid=checks] >> text=Approved');
		await page.screenshot({ path: screenshotPath('specimen-with-check'), fullPage: true });
		await page.goto(`${base()}/specimens?q=${encodeURIComponent(number)}&grade=poor`);
		await expect.poll(() => page.locator('[data-testid=register-row]').count()).toBe(1);
		await page.close();
	});
});

describe('two people saving one draft', () => {
	it('refuses the stale save, keeps what was typed, and lets the person save over knowingly', async () => {
		const a = await browser().newPage();
		await signInAs(a, 'conservator', '/');
		// The demo data has drafts; open the first of mine in two tabs.
		const link = a.locator('[data-testid=checks-mine] a').first();
		await link.waitFor();
		const href = (await link.getAttribute('href'))!;
		const b = await browser().newPage();
		await a.goto(new URL(href, a.url()).toString());
		await b.goto(new URL(href, a.url()).toString());
		await a.getByLabel('Notes').waitFor();
		await b.getByLabel('Notes').waitFor();
		await a.getByLabel('Notes').fill('Saved first, in tab A.');
		await a.click('text=Save draft');
		await expect.poll(() => a.locator('[data-testid=check-trail]').textContent()).toMatch(/saved/);
		await b.getByLabel('Notes').fill('Typed in tab B, must not be lost.');
		await b.click('text=Save draft');
		await b.waitForSelector('[data-testid=check-conflict]');
		expect(await b.getByLabel('Notes').inputValue()).toBe('Typed in tab B, must not be lost.');
		await b.click('text=Keep mine, then save again');
		await b.click('text=Save draft');
		await expect.poll(async () => {
			await a.reload();
			return a.getByLabel('Notes').inputValue();
		}).toBe('Typed in tab B, must not be lost.');
		await a.close();
		await b.close();
	});
});
