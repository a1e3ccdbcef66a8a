import { describe, expect, inject, it } from 'vitest';
import { islandsReady, screenshotPath, useBrowser } from '../helpers/browser.ts';

/**
 * An administrator invites a person on the Users page; the invitation shows in the development
 * mailbox; the invited person follows its link, chooses a password and lands on their home page.
 */
const base = () => inject('baseUrl');
const browser = useBrowser();

describe('inviting a person', () => {
	it('goes from the Users page to the mailbox to a new account that can sign in', async () => {
		const email = `invited-${Date.now()}@example.org`;
		const page = await browser().newPage();
		page.on('dialog', (d) => d.accept());
		await page.goto(`${base()}/login?next=/admin/users`);
		await page.fill('#email', 'admin@example.org');
		await page.fill('#password', inject('demoPassword'));
		await Promise.all([page.waitForURL(/\/admin\/users$/), page.click('button[type=submit]')]);
		await islandsReady(page);

		// A mistake first: the form says what is wrong before anything is sent.
		await page.fill('#invite-name', 'Wren Halloway');
		await page.fill('#invite-email', 'not an address');
		await page.click('text=Send the invitation');
		await expect.poll(() => page.textContent('#invite-email-err')).toMatch(/e-mail address such as/);

		await page.fill('#invite-email', email);
		await page.selectOption('#invite-role', 'curator');
		await page.click('text=Send the invitation');
		await page.waitForSelector(`text=Invitation sent to ${email}.`);
		await page.waitForSelector(`[data-testid="user-${email}"] >> text=Invited`);

		await page.goto(`${base()}/admin/mailbox`);
		const mail = page.locator('[data-testid=mail]', { hasText: email }).first();
		await mail.waitFor({ timeout: 20_000 });
		await page.screenshot({ path: screenshotPath('mailbox') });
		const href = await mail.locator('a').first().getAttribute('href');
		expect(href).toMatch(/\/reset\/[A-Za-z0-9_-]{43}$/);

		await browser().clearCookies();
		await page.goto(href!);
		expect(await page.textContent('h1')).toBe('Choose your password');
		await page.fill('#password', 'wren chooses a long password');
		await page.fill('#confirm', 'wren chooses a long password');
		await Promise.all([page.waitForLoadState('load'), page.click('button[type=submit]')]);
		await page.waitForSelector('text=Your password is set');
		await page.click('text=Sign in');
		await page.fill('#email', email);
		await page.fill('#password', 'wren chooses a long password');
		await Promise.all([page.waitForURL((u) => u.pathname === '/'), page.click('button[type=submit]')]);
		await page.waitForSelector('[data-testid=home-curator]');
		await page.close();
	});
});
