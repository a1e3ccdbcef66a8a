import { describe, expect, it } from 'vitest';
import { screenshotPath, signInAs, useBrowser } from '../helpers/browser.ts';
import { call, signIn } from '../helpers/server.ts';
import { makeSpecimen, openCheck, sampleJpeg, settled, tusUpload } from '../helpers/photos.ts';

/**
 * The condition map in a browser: a conservator outlines a loss, draws a crack, drops a pin and
 * sets the scale, sees the loss's area in mm², undoes and redoes, reloads and finds every mark; a
 * curator sees them read-only.
 */
const browser = useBrowser();

describe('the condition map', () => {
	it('keeps what a conservator draws, measured with the scale bar', async () => {
		const cookie = await signIn('conservator@example.org');
		const specimenId = await makeSpecimen(cookie, 'MAP');
		const check = await openCheck(cookie, specimenId);
		const { id } = await tusUpload(await sampleJpeg(1600, 1200), { cookie, meta: { filename: 'map.jpg', filetype: 'image/jpeg', specimenId, checkId: check.id, view: 'front', stage: 'as-found' } });
		const { photoId } = await settled(cookie, id);
		const page = await browser().newPage();
		const errors: string[] = [];
		page.on('pageerror', (e) => errors.push(e.message));
		await signInAs(page, 'conservator', `/photos/${photoId}/marks`);
		const canvas = page.getByTestId('mark-canvas');
		await canvas.locator('canvas').first().waitFor();
		const b = (await canvas.boundingBox())!;
		const at = (x: number, y: number) => [b.x + x, b.y + y] as const;
		await canvas.focus();

		// An outline of the specimen: a 100 × 100 screen-pixel square, closed on its first point.
		await page.getByTestId('new-part').selectOption('specimen');
		await page.getByTestId('new-term').selectOption('tissue loss');
		await page.keyboard.press('o');
		for (const [x, y] of [[200, 200], [300, 200], [300, 300], [200, 300], [200, 200]] as const) await page.mouse.click(...at(x, y));
		// A crack along the seal, by dragging with the Line tool.
		await page.getByTestId('new-part').selectOption('seal');
		await page.keyboard.press('l');
		await page.mouse.move(...at(150, 100));
		await page.mouse.down();
		await page.mouse.move(...at(250, 110), { steps: 5 });
		await page.mouse.move(...at(350, 105), { steps: 5 });
		await page.mouse.up();
		// A pin where a thread snapped.
		await page.getByTestId('new-part').selectOption('mount');
		await page.keyboard.press('p');
		await page.mouse.click(...at(400, 150));
		// The scale: 300 screen px stand for 100 mm.
		await page.getByLabel('Scale bar length (mm)').fill('100');
		await canvas.focus();
		await page.keyboard.press('m');
		await page.mouse.move(...at(100, 400));
		await page.mouse.down();
		await page.mouse.move(...at(400, 400), { steps: 8 });
		await page.mouse.up();
		await expect.poll(() => page.getByTestId('mark-list').locator('li').count()).toBe(4);
		// (100 px · 100 mm / 300 px)² = 1,111 mm², whatever the zoom.
		await expect.poll(() => page.getByTestId('mark-list').textContent()).toMatch(/tissue loss · severe|tissue loss · moderate/);
		await expect.poll(() => page.getByTestId('mark-list').textContent()).toMatch(/1,11\d mm²/);
		// Choosing a mark in the list selects it and shows its size and handles.
		await page.getByTestId('mark-list').getByText(/tissue loss/).click();
		await expect.poll(() => page.getByTestId('selected-size').textContent()).toMatch(/Area .* px² ≈ 1,11\d mm²/);
		// Not fullPage: resizing the viewport for the shot would refit the canvas.
		await page.screenshot({ path: screenshotPath('marks-drawn') });

		// Undo takes the scale bar away (and with it the mm), redo brings it back.
		await canvas.focus();
		await page.keyboard.press('Control+z');
		await expect.poll(() => page.getByTestId('mark-list').locator('li').count()).toBe(3);
		await page.keyboard.press('Control+y');
		await expect.poll(() => page.getByTestId('mark-list').locator('li').count()).toBe(4);
		await expect.poll(() => page.getByTestId('sync-state').getAttribute('data-state'), { timeout: 10_000 }).toBe('saved');

		await page.reload();
		await expect.poll(() => page.getByTestId('mark-list').locator('li').count(), { timeout: 10_000 }).toBe(4);
		await expect.poll(() => page.getByTestId('mark-list').textContent()).toMatch(/1,11\d mm²/);
		const saved = await (await call(`/api/photos/${photoId}/marks`, { cookie })).json();
		expect(saved.layer.marks.map((m: { kind: string }) => m.kind).sort()).toEqual(['outline', 'path', 'pin', 'scale']);
		expect(errors).toEqual([]);

		// While the view moves the marks are a bitmap drawn by a worker, scaled with the photo; once
		// still they are stroked again. The two must cover the same pixels, or marks would jump.
		await page.waitForTimeout(600);
		expect(page.workers().length).toBeGreaterThan(0);
		const frames = await page.evaluate(async () => {
			const box = document.querySelector<HTMLElement>('[data-testid=mark-canvas]')!;
			const layer = box.querySelectorAll('canvas')[1]!;
			const nextFrame = () => new Promise((r) => requestAnimationFrame(() => r(null)));
			const cover = () => {
				const d = layer.getContext('2d')!.getImageData(0, 0, layer.width, layer.height).data;
				const m = new Uint8Array(d.length / 4);
				for (let i = 0; i < m.length; i++) m[i] = d[i * 4 + 3]! > 128 ? 1 : 0;
				return { m, drawn: layer.dataset.marksDrawn };
			};
			const r = box.getBoundingClientRect();
			// The worker's first bitmap may still be on its way on a busy machine: try a few gestures.
			let moving = cover();
			for (let attempt = 0; attempt < 6; attempt++) {
				box.dispatchEvent(new WheelEvent('wheel', { deltaY: attempt % 2 ? 120 : -120, clientX: r.left + 300, clientY: r.top + 250, bubbles: true }));
				await nextFrame();
				await nextFrame();
				moving = cover();
				if (moving.drawn === 'bitmap') break;
				await new Promise((res) => setTimeout(res, 500));
			}
			await new Promise((res) => setTimeout(res, 400));
			await nextFrame();
			await nextFrame();
			const still = cover();
			// A covered pixel of one frame "agrees" when the other covers a pixel within 2 px of it:
			// scaling softens and thickens edges by a pixel, a misplaced bitmap moves whole marks.
			const w = layer.width;
			const agree = (a: Uint8Array, b: Uint8Array) => {
				let n = 0;
				let ok = 0;
				for (let i = 0; i < a.length; i++) {
					if (!a[i]) continue;
					n++;
					const x = i % w;
					const y = (i - x) / w;
					search: for (let dy = -2; dy <= 2; dy++) for (let dx = -2; dx <= 2; dx++) if (b[(y + dy) * w + x + dx]) { ok++; break search; }
				}
				return { n, share: n ? ok / n : 0 };
			};
			return { movingDrawn: moving.drawn, stillDrawn: still.drawn, moving: agree(moving.m, still.m), still: agree(still.m, moving.m) };
		});
		expect(frames).toMatchObject({ movingDrawn: 'bitmap', stillDrawn: 'strokes' });
		expect(frames.still.n).toBeGreaterThan(1000);
		expect(frames.moving.share).toBeGreaterThan(0.97);
		expect(frames.still.share).toBeGreaterThan(0.97);

		// A curator reads the same marks but has no drawing tools.
		await signInAs(page, 'curator', `/photos/${photoId}/marks`);
		await expect.poll(() => page.getByTestId('mark-list').locator('li').count(), { timeout: 10_000 }).toBe(4);
		await expect(page.getByTestId('sync-state').textContent()).resolves.toMatch(/Read-only/);
		expect(await page.getByRole('navigation', { name: 'Tools' }).getByRole('button').allTextContents()).toEqual(['S Select']);
		await page.screenshot({ path: screenshotPath('marks-curator'), fullPage: true });
	});
});
