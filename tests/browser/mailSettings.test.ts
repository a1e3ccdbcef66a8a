import { beforeAll, describe, expect, it } from 'vitest';
import { islandsReady, screenshotPath, signInAs, useBrowser } from '../helpers/browser.ts';
import { baseUrl, useTestDatabase } from '../helpers/server.ts';
import { cookieFor, makeUser } from '../helpers/users.ts';
import { newSpecimen, submittedCheck } from '../helpers/checks.ts';

/**
 * A conservator turns off one kind of mail from the header's Mail link, and it stays off after a
 * reload; the development mailbox shows the mail a submitted check sends the reviewers.
 */
const browser = useBrowser();
let email = '';
let cookie = '';

beforeAll(async () => {
	useTestDatabase();
	const { user } = await makeUser('conservator', { tag: 'mail-page' });
	email = user.email;
	cookie = await cookieFor(user.id);
});

describe('mail settings and the mailbox', () => {
	it('keeps a kind of mail turned off across a reload', async () => {
		const page = await browser().newPage();
		await signInAs(page, email, '/');
		await Promise.all([page.waitForURL(/\/account\/mail$/), page.click('header a[href="/account/mail"]')]);
		await islandsReady(page);
		const returned = page.getByLabel('My check was returned');
		await returned.waitFor();
		expect(await returned.isChecked()).toBe(true);
		expect(await page.getByLabel('Daily list of checks coming due').isChecked()).toBe(true);
		// A conservator is not offered the reviewers' mail.
		expect(await page.getByLabel('A check is waiting for review').count()).toBe(0);
		await returned.uncheck();
		await expect.poll(() => page.textContent('[data-testid=mail-status]')).toBe('Saved.');
		await page.screenshot({ path: screenshotPath('mail-settings') });
		await page.reload();
		await islandsReady(page);
		await page.getByLabel('My check was returned').waitFor();
		expect(await page.getByLabel('My check was returned').isChecked()).toBe(false);
		expect(await page.getByLabel('My check was approved').isChecked()).toBe(true);
		await page.close();
	});

	it('shows the mail of a submitted check in the admin mailbox', async () => {
		const s = await newSpecimen(cookie, `MB${process.pid}`);
		const c = await submittedCheck(cookie, s.id);
		const page = await browser().newPage();
		await signInAs(page, 'admin', '/admin/mailbox');
		const mail = page.locator('[data-testid=mail]', { hasText: `Check of ${s.objectNumber} waiting for review` }).first();
		await mail.waitFor({ timeout: 20_000 });
		await page.screenshot({ path: screenshotPath('mailbox-check-submitted') });
		expect(await mail.locator('a', { hasText: `/checks/${c.id}` }).first().getAttribute('href')).toBe(`${baseUrl()}/checks/${c.id}`);
		await page.close();
	});
});
