import { beforeAll, describe, expect, it } from 'vitest';
import { islandsReady, screenshotPath, signInAs, useBrowser } from '../helpers/browser.ts';
import { useTestDatabase } from '../helpers/server.ts';
import { makeUser } from '../helpers/users.ts';
import { signInFrom } from '../helpers/signInFrom.ts';

/**
 * An administrator reads the security log (TESTPLAN A10): a failed sign-in from another address is
 * listed with its time and address, and the "Refused requests" filter leaves it out.
 */
const browser = useBrowser();
let email = '';

beforeAll(async () => {
	useTestDatabase();
	const { user } = await makeUser('reviewer', { tag: 'seclog-page' });
	email = user.email;
	expect((await signInFrom(email, 'wrong passphrase for the log page', { from: '127.0.0.9' })).status).toBe(401);
});

describe('the security log page', () => {
	it('lists a failed sign-in with its address, and filters by kind', async () => {
		const page = await browser().newPage();
		await signInAs(page, 'admin', '/');
		await Promise.all([page.waitForURL(/\/admin\/security$/), page.click('header a[href="/admin/security"]')]);
		await islandsReady(page);
		const failed = page.locator('[data-testid=security-event][data-action="sign-in.failed"]', { hasText: email }).first();
		await failed.waitFor();
		expect(await failed.textContent()).toContain('127.0.0.9');
		expect(await failed.locator('time').getAttribute('title')).toMatch(/UTC$/);
		await page.screenshot({ path: screenshotPath('security-log') });
		await page.getByLabel('Events').selectOption('access');
		await expect.poll(() => page.locator('[data-testid=security-event][data-action="sign-in.failed"]').count()).toBe(0);
		await page.close();
	});
});
