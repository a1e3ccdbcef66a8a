import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { screenshotPath, signInAs, useBrowser } from '../helpers/browser.ts';
import { call, signIn } from '../helpers/server.ts';
import type { Mark, MarkLayer } from '../../src/lib/marks/schema.ts';

/**
 * A reviewer compares the showcase jar's last two photographs (db/seeders/demoPhotos.ts: the camera
 * stood a little differently each time, the seal crack grew and the fluid fell): places control
 * point pairs on features both show, sees the fit's error, the swipe lined up, and the summary
 * listing the grown crack and the fluid loss; saves the comparison and reopens it.
 */
const browser = useBrowser();

interface SourcePhoto {
	id: string;
	width: number;
	view: string;
	check: { checkedOn: string; status: string } | null;
	layer: { layer: MarkLayer };
}

/** Features both photographs show, from their own marks: the scale bar's ends, the grey card's corners, the inner base's end. */
function features(layer: MarkLayer): [number, number][] {
	const find = <K extends Mark['kind']>(kind: K, f?: (m: Extract<Mark, { kind: K }>) => boolean) => layer.marks.find((m): m is Extract<Mark, { kind: K }> => m.kind === kind && (!f || f(m as Extract<Mark, { kind: K }>)))!;
	const scale = find('scale');
	const grey = find('grey');
	const base = find('level', (m) => m.level === 'inner-base');
	return [scale.from, scale.to, [grey.x, grey.y], [grey.x + grey.w, grey.y + grey.h], base.from];
}

/** Click a photo pixel in a pane, through the view the pane reports. */
async function clickPhoto(page: Page, testId: string, [x, y]: [number, number]) {
	const pane = page.getByTestId(testId);
	const view = JSON.parse((await pane.getAttribute('data-view'))!) as { scale: number; x: number; y: number };
	const box = (await pane.boundingBox())!;
	await page.mouse.click(box.x + (x - view.x) * view.scale, box.y + (y - view.y) * view.scale);
}

describe('comparing two photographs', () => {
	it('lines them up on control points and shows what changed', async () => {
		const cookie = await signIn('reviewer@example.org');
		const found = await (await call('/api/specimens?q=STC.1898.014', { cookie })).json();
		const specimenId = found.rows[0].id as string;
		const sources = await (await call(`/api/specimens/${specimenId}/comparison-sources`, { cookie })).json();
		// The two demo front views with checks, older first (other tests may add photos to this jar).
		const fronts = (sources.photos as SourcePhoto[]).filter((p) => p.view === 'front' && p.check).sort((a, b) => a.check!.checkedOn.localeCompare(b.check!.checkedOn));
		const [before, after] = fronts.slice(-2) as [SourcePhoto, SourcePhoto];
		expect(after.check!.status).toBe('in-review');

		const page = await browser().newPage();
		await page.setViewportSize({ width: 1440, height: 1000 });
		const errors: string[] = [];
		page.on('pageerror', (e) => errors.push(e.message));
		await signInAs(page, 'reviewer', `/specimens/${specimenId}/compare?before=${before.id}&after=${after.id}`);
		await page.getByTestId('pane-before').locator('canvas').first().waitFor();
		await page.getByTestId('pane-after').locator('canvas').first().waitFor();
		await expect.poll(() => page.getByTestId('pane-before').getAttribute('data-view')).not.toBeNull();

		// Unaligned at first: the camera moved, so the summary says the comparison is not lined up.
		await expect.poll(() => page.getByTestId('registration-result').textContent()).toMatch(/at least 4 pairs/);

		// Four pairs fit a perspective exactly (every error 0, and the panel says so); a fifth checks them.
		const a = features(before.layer.layer);
		const b = features(after.layer.layer);
		for (let i = 0; i < a.length; i++) {
			await clickPhoto(page, 'pane-before', a[i]!);
			await clickPhoto(page, 'pane-after', b[i]!);
			if (i === 3) await expect.poll(() => page.getByTestId('registration-result').textContent()).toMatch(/Fitted on 4 pairs.*exactly 4 pairs/);
		}
		await expect.poll(() => page.getByTestId('pairs').locator('tbody tr').count()).toBe(5);
		const rms = Number((await page.getByTestId('rms').textContent())!.replace(/[^\d.]/g, ''));
		// Clicks land on whole screen pixels, about 3 photo px at this zoom; a misplaced pair would be tens.
		expect(rms).toBeGreaterThanOrEqual(0);
		expect(rms).toBeLessThan(6);
		await page.screenshot({ path: screenshotPath('compare-points') });

		// Lined up: the swipe shows both in the earlier frame.
		await page.getByTestId('mode-swipe').click();
		await page.getByTestId('pane-swipe').locator('canvas').first().waitFor();
		expect(await page.getByTestId('unaligned').count()).toBe(0);
		await page.getByTestId('swipe-divider').focus();
		for (let i = 0; i < 5; i++) await page.keyboard.press('ArrowLeft');
		expect(Number(await page.getByTestId('swipe-divider').getAttribute('aria-valuenow'))).toBe(40);
		await page.screenshot({ path: screenshotPath('compare-swipe') });

		// The change summary: the seal crack grew, the fluid fell.
		const summary = page.getByTestId('change-summary');
		await expect.poll(() => summary.getByTestId('change-list').textContent()).toMatch(/Seal, cracked: grown/i);
		await expect.poll(() => summary.getByTestId('fluid-change').textContent()).toMatch(/losing [\d.]+ mm a year/);
		await expect.poll(() => summary.getByTestId('fluid-change').textContent()).toMatch(/Colour: ΔE00/);
		// The reviewer can decide on the check in review from here (not taken: other tests count the demo's checks in review).
		await expect(page.getByTestId('decision').getByRole('button', { name: 'Approve the check' }).isVisible()).resolves.toBe(true);

		await page.getByTestId('mode-overlay').click();
		await page.screenshot({ path: screenshotPath('compare-overlay') });
		await page.getByTestId('mode-side').click();
		await page.screenshot({ path: screenshotPath('compare-side') });

		// Saved, and reopened with its points.
		await page.getByTestId('save-comparison').click();
		await page.getByTestId('saved').waitFor();
		expect(page.url()).toMatch(/\/comparisons\/[0-9a-f-]{36}$/);
		await page.reload();
		await expect.poll(() => page.getByTestId('pairs').locator('tbody tr').count(), { timeout: 10_000 }).toBe(5);
		await expect.poll(() => page.getByTestId('change-list').textContent()).toMatch(/Seal, cracked: grown/i);
		expect(errors).toEqual([]);
	});
});
