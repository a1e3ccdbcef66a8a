import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, inject } from 'vitest';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

/**
 * Debian's Chromium driven by playwright-core, with a fresh profile each time and the flags this
 * machine needs (no sandbox as root, no background network). Screenshots go to test-results/.
 */
export const CHROMIUM_ARGS = [
	'--headless',
	'--no-sandbox',
	'--disable-gpu',
	'--disable-quic',
	'--no-first-run',
	'--disable-background-networking',
	'--disable-component-update',
	'--disable-sync',
];

export async function openBrowser(): Promise<{ context: BrowserContext; close(): Promise<void> }> {
	const profile = fs.mkdtempSync(path.join(os.tmpdir(), 'meniscus-chromium-'));
	const context = await chromium.launchPersistentContext(profile, {
		executablePath: '/usr/bin/chromium',
		headless: true,
		args: CHROMIUM_ARGS,
		viewport: { width: 1180, height: 820 },
	});
	// Fail a stuck step with its own message well before the test's 30 s limit.
	context.setDefaultTimeout(10_000);
	return {
		context,
		async close() {
			await context.close();
			fs.rmSync(profile, { recursive: true, force: true });
		},
	};
}

export function screenshotPath(name: string): string {
	const dir = path.resolve('test-results', 'screens');
	fs.mkdirSync(dir, { recursive: true });
	return path.join(dir, `${name}.png`);
}

/** Opens one browser for the test file and closes it afterwards; call at the top of the file. */
export function useBrowser(): () => BrowserContext {
	let browser: Awaited<ReturnType<typeof openBrowser>> | undefined;
	beforeAll(async () => {
		browser = await openBrowser();
	});
	afterAll(async () => {
		await browser?.close();
	});
	return () => {
		if (!browser) throw new Error('the browser is not open yet');
		return browser.context;
	};
}

/** Signs in on the real form as a demo role (or an address) and waits until `next` has loaded. */
export async function signInAs(page: Page, who: string, next: string): Promise<void> {
	await page.context().clearCookies();
	await page.goto(`${inject('baseUrl')}/login?next=${encodeURIComponent(next)}`);
	await page.fill('#email', who.includes('@') ? who : `${who}@example.org`);
	await page.fill('#password', inject('demoPassword'));
	await Promise.all([page.waitForURL((u) => u.pathname === next.split('?')[0]), page.click('button[type=submit]')]);
	await islandsReady(page);
}

/**
 * Waits until every island on the page has hydrated (Astro drops the `ssr` attribute then). Typing
 * into a server-rendered input before that is lost when React takes the input over.
 */
export async function islandsReady(page: Page): Promise<void> {
	await page.waitForFunction(() => !document.querySelector('astro-island[ssr]'));
}
