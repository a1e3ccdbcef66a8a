import http from 'node:http';
import { describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { screenshotPath, useBrowser } from '../helpers/browser.ts';

/** The sign-in journey in a real browser against the built server. */
const base = () => inject('baseUrl');
const browser = useBrowser();

/** Console errors and uncaught exceptions of a page (CSP violations show up here). */
function watchConsole(page: Page): string[] {
	const problems: string[] = [];
	page.on('console', (m) => m.type() === 'error' && problems.push(m.text()));
	page.on('pageerror', (e) => problems.push(e.message));
	// Fonts and scripts ship with the app: no request may leave this site.
	page.on('request', (r) => !r.url().startsWith(base()) && problems.push(`request to ${r.url()}`));
	return problems;
}

async function signInAs(page: Page, email: string) {
	await page.fill('#email', email);
	await page.fill('#password', inject('demoPassword'));
	await Promise.all([page.waitForURL((u) => !u.pathname.startsWith('/login')), page.click('button[type=submit]')]);
}

describe('signing in with a browser', () => {
	it.each([
		['conservator', 'Your work'],
		['reviewer', 'Your review desk'],
		['curator', 'The collection at a glance'],
		['admin', 'Administration'],
	])('shows the %s their own home page', async (role, heading) => {
		const page = await browser().newPage();
		const problems = watchConsole(page);
		await browser().clearCookies();
		await page.goto(`${base()}/login`);
		await signInAs(page, `${role}@example.org`);
		expect(new URL(page.url()).pathname).toBe('/');
		await expect.poll(() => page.textContent('[data-testid=home-heading]')).toBe(heading);
		await page.waitForSelector(`[data-testid=home-${role}]`);
		await page.screenshot({ path: screenshotPath(`home-${role}`), fullPage: true });
		// The hashed CSP must not block any of the app's own scripts or styles.
		expect(problems).toEqual([]);
		await page.close();
	});

	it('fits a tablet held upright in a store room', async () => {
		const page = await browser().newPage();
		await page.setViewportSize({ width: 768, height: 1024 });
		await browser().clearCookies();
		await page.goto(`${base()}/login`);
		await signInAs(page, 'conservator@example.org');
		await page.waitForSelector('[data-testid=home-conservator]');
		// Nothing wider than the screen: no sideways scrolling.
		expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(768);
		const signOut = await page.locator('text=Sign out').boundingBox();
		expect(signOut!.height).toBeGreaterThanOrEqual(44);
		await page.screenshot({ path: screenshotPath('home-tablet'), fullPage: true });
		await page.close();
	});

	it('sends a signed-out visit to a protected page to sign-in, and back there afterwards', async () => {
		await browser().clearCookies();
		const page = await browser().newPage();
		await page.goto(`${base()}/admin/users`);
		const url = new URL(page.url());
		expect(url.pathname).toBe('/login');
		expect(url.searchParams.get('next')).toBe('/admin/users');
		await page.screenshot({ path: screenshotPath('login') });
		await signInAs(page, 'admin@example.org');
		expect(new URL(page.url()).pathname).toBe('/admin/users');
		await page.waitForSelector('[data-testid="user-conservator@example.org"]');
		await page.screenshot({ path: screenshotPath('admin-users'), fullPage: true });
		await page.close();
	});

	it('shows a clear message for a wrong password and keeps the address typed', async () => {
		await browser().clearCookies();
		const page = await browser().newPage();
		await page.goto(`${base()}/login`);
		await page.fill('#email', 'curator@example.org');
		await page.fill('#password', 'certainly not right');
		await Promise.all([page.waitForLoadState('load'), page.click('button[type=submit]')]);
		await expect.poll(() => page.textContent('[role=alert]')).toMatch(/do not match an active account/);
		expect(await page.inputValue('#email')).toBe('curator@example.org');
		await page.close();
	});

	it('refuses a form posted to Meniscus from a page on another origin', async () => {
		// A page served from another origin (another port) that posts a sign-in form to Meniscus.
		const evil = http.createServer((_req, res) => {
			res.setHeader('content-type', 'text/html');
			res.end(`<form id="f" method="post" action="${base()}/login">
				<input name="email" value="admin@example.org"><input name="password" value="x"></form>
				<script>document.getElementById('f').submit()</script>`);
		});
		await new Promise<void>((r) => evil.listen(0, '127.0.0.2', r));
		const port = (evil.address() as { port: number }).port;
		const page = await browser().newPage();
		const answer = page.waitForResponse((r) => r.url().startsWith(`${base()}/login`) && r.request().method() === 'POST');
		await page.goto(`http://127.0.0.2:${port}/`);
		const res = await answer;
		expect(res.status()).toBe(403);
		await page.close();
		evil.close();
	});
});
