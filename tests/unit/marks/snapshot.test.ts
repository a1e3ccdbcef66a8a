import { describe, expect, it } from 'vitest';
import { SNAPSHOT, sameMarks, snapshotPixels, snapshotRegion, snapshotServes } from '../../../src/lib/marks/snapshot.ts';
import { panBy, zoomAbout } from '../../../src/lib/photos/viewport.ts';

// The bitmap that stands in for the marks while a view moves (lib/marks/snapshot.ts). Plain view
// arithmetic, worked by hand below; no published source is involved.
const photo = { width: 9504, height: 6336 };
const box = { w: 1400, h: 900 };

describe('the region a bitmap covers', () => {
	it('is the view grown by the margin on each side, in photo pixels', () => {
		// Zoom 0.5, top-left at (2000, 1000): the view is 2800 × 1800 photo px; half of that beyond
		// each edge gives x from 600 to 6200 and y from 100 to 3700.
		const r = snapshotRegion({ scale: 0.5, x: 2000, y: 1000 }, box, photo);
		expect(SNAPSHOT.margin).toBe(0.5);
		expect(r).toEqual({ x: 600, y: 100, w: 5600, h: 3600, scale: 0.5 });
		expect(snapshotPixels(r)).toEqual({ w: 2800, h: 1800 });
	});

	it('stops at the photo, plus the reach of labels beyond its edge', () => {
		// At 10 % the whole photo is in view: the region is the photo and 64 screen px (640 photo px) around it.
		const r = snapshotRegion({ scale: 0.1, x: -2000, y: -1000 }, box, photo);
		const pad = SNAPSHOT.padPx / 0.1;
		expect(r.x).toBeCloseTo(-pad, 9);
		expect(r.y).toBeCloseTo(-pad, 9);
		expect(r.w).toBeCloseTo(photo.width + 2 * pad, 9);
		expect(r.h).toBeCloseTo(photo.height + 2 * pad, 9);
	});

	it('shrinks the margin on a large screen so the bitmap stays under its pixel budget', () => {
		// 3840 × 2160 at device pixel ratio 2 is 33 MP already: no room for any margin.
		const big = { w: 3840, h: 2160 };
		const r = snapshotRegion({ scale: 1, x: 3000, y: 2000 }, big, photo, 2);
		expect(r).toMatchObject({ x: 3000, y: 2000, w: 3840, h: 2160 });
		// 1920 × 1080 at ratio 1 is 2.07 MP; (1 + 2m)² · 2.07 ≤ 16 allows the full half margin.
		expect(snapshotRegion({ scale: 1, x: 3000, y: 2000 }, { w: 1920, h: 1080 }, photo).x).toBe(3000 - 960);
	});
});

describe('whether a bitmap can stand in for a view', () => {
	const start = { scale: 0.5, x: 2000, y: 1000 };
	const region = snapshotRegion(start, box, photo);

	it('serves the view it was drawn for and pans within its margin', () => {
		expect(snapshotServes(region, start, box, photo)).toBe(true);
		// 700 screen px right is 1400 photo px: the view's right edge reaches 2000 + 1400 + 2800 = 6200, the region's edge.
		expect(snapshotServes(region, panBy(start, 700, 0), box, photo)).toBe(true);
		expect(snapshotServes(region, panBy(start, 702, 0), box, photo)).toBe(false);
		expect(snapshotServes(region, panBy(start, 0, -460), box, photo)).toBe(false);
	});

	it('serves zooms up to the rescale limit either way, not beyond', () => {
		const zoomIn = (f: number) => zoomAbout(start, f, box.w / 2, box.h / 2, 0.01, 10);
		expect(snapshotServes(region, zoomIn(SNAPSHOT.maxRescale), box, photo)).toBe(true);
		expect(snapshotServes(region, zoomIn(SNAPSHOT.maxRescale * 1.01), box, photo)).toBe(false);
		// Zooming out by 2 about the centre doubles the view: exactly the region with its half margins.
		expect(snapshotServes(region, zoomIn(0.5), box, photo)).toBe(true);
		expect(snapshotServes(region, zoomIn(0.49), box, photo)).toBe(false);
	});

	it('needs to cover only the photo: a whole-photo bitmap serves any zoom-out within the limit', () => {
		const fit = { scale: 0.1, x: -2000, y: -1000 };
		const whole = snapshotRegion(fit, box, photo);
		const out = zoomAbout(fit, 1 / SNAPSHOT.maxRescale, 700, 450, 0.001, 10);
		expect(snapshotServes(whole, out, box, photo)).toBe(true);
		// A view that shows none of the photo needs nothing from it.
		expect(snapshotServes(whole, { scale: 0.1, x: 50_000, y: 0 }, box, photo)).toBe(true);
	});
});

describe('same marks', () => {
	it('compares the mark objects, not their contents', () => {
		const a = { id: 'a' };
		const b = { id: 'b' };
		expect(sameMarks([a, b], [a, b])).toBe(true);
		expect(sameMarks([a, b], [a, { id: 'b' }])).toBe(false);
		expect(sameMarks([a], [a, b])).toBe(false);
	});
});
