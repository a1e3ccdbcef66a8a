import { describe, expect, it } from 'vitest';
import { fitView, panBy, visibleRect, zoomAbout } from '../../../src/lib/photos/viewport.ts';
import { toPhoto, screenPoint } from '../../../src/lib/marks/geometry.ts';

/** View arithmetic (worked by hand in the comments; common practice, no published source). */
describe('the view of a zoomable photo', () => {
	it('fits a 4000 × 2000 photo into an 800 × 600 box at 0.2, centred vertically', () => {
		// 800/4000 = 0.2 < 600/2000 = 0.3; the shown height is 400 px, so 100 px above: 100/0.2 = 500 photo px.
		expect(fitView({ w: 800, h: 600 }, { width: 4000, height: 2000 })).toEqual({ scale: 0.2, x: -0, y: -500 });
	});

	it('keeps the photo point under the pointer when zooming, and clamps the zoom', () => {
		const v = { scale: 0.5, x: 100, y: 200 };
		const before = toPhoto(screenPoint(300, 150), v);
		const z = zoomAbout(v, 2, 300, 150, 0.1, 4);
		expect(z.scale).toBe(1);
		const after = toPhoto(screenPoint(300, 150), z);
		expect(after[0]).toBeCloseTo(before[0], 9);
		expect(after[1]).toBeCloseTo(before[1], 9);
		expect(zoomAbout(v, 100, 0, 0, 0.1, 4).scale).toBe(4);
	});

	it('pans by screen pixels and reports the visible photo rectangle', () => {
		expect(panBy({ scale: 0.5, x: 10, y: 20 }, 50, -20)).toEqual({ scale: 0.5, x: 110, y: -20 });
		expect(visibleRect({ scale: 0.5, x: 10, y: 20 }, { w: 800, h: 600 })).toEqual({ x: 10, y: 20, w: 1600, h: 1200 });
	});
});
