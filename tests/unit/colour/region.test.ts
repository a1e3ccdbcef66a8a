import { describe, expect, it } from 'vitest';
import { pointInPolygon, type XY } from '../../../src/lib/marks/geometry.ts';
import { meanColourInBox, meanColourInPolygon, srgbToLinear } from '../../../src/lib/colour/index.ts';
import { near, nearTriple } from './reference.ts';

/** A width × height image of `channels` channels, every pixel from fill(x, y). */
function image(width: number, height: number, fill: (x: number, y: number) => number[], channels = 3): Uint8ClampedArray {
	const px = new Uint8ClampedArray(width * height * channels);
	for (let y = 0; y < height; y++) for (let x = 0; x < width; x++) px.set(fill(x, y).slice(0, channels), (y * width + x) * channels);
	return px;
}

/** Pixels whose centres pointInPolygon (marks/geometry.ts, crossing number, a different code path) puts inside. */
function bruteCount(width: number, height: number, polygon: XY[]): number {
	let n = 0;
	for (let y = 0; y < height; y++) for (let x = 0; x < width; x++) if (pointInPolygon([x + 0.5, y + 0.5], polygon)) n++;
	return n;
}

/** A small deterministic generator (mulberry32), so a failing polygon can be replayed. */
function random(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = Math.imul(a ^ (a >>> 15), 1 | a);
		t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

const grey = (v: number) => () => [v, v, v, 255];
const lin = (r: number, g: number, b: number) => [r, g, b].map((c) => srgbToLinear(c / 255));

describe('meanColourInPolygon: which pixels count', () => {
	it('counts exactly the pixels of a square whose edges lie on pixel boundaries', () => {
		const px = image(10, 10, grey(100));
		expect(meanColourInPolygon(px, 10, 10, 3, [[2, 3], [7, 3], [7, 6], [2, 6]]).count).toBe(15);
	});

	it('counts a pixel when its centre is inside, not when the outline merely touches it', () => {
		const px = image(10, 10, grey(100));
		// A strip from x 2.4 to 2.6 holds the centres (x = 2.5) of one column of ten pixels.
		expect(meanColourInPolygon(px, 10, 10, 3, [[2.4, 0], [2.6, 0], [2.6, 10], [2.4, 10]]).count).toBe(10);
		// x 2.6 … 3.4 covers no centre at all, though it overlaps a column of pixels.
		expect(meanColourInPolygon(px, 10, 10, 3, [[2.6, 0], [3.4, 0], [3.4, 10], [2.6, 10]]).count).toBe(0);
	});

	it('agrees with a point-in-polygon test of every pixel centre for random, concave and self-crossing outlines (even-odd rule)', () => {
		const w = 37;
		const h = 29;
		const px = image(w, h, grey(120));
		const rnd = random(20261202);
		for (let trial = 0; trial < 200; trial++) {
			const n = 3 + Math.floor(rnd() * 9);
			// Reaching past the image on every side, so clipping to the image is exercised too.
			const poly: XY[] = Array.from({ length: n }, () => [rnd() * (w + 10) - 5, rnd() * (h + 10) - 5] as const);
			expect(meanColourInPolygon(px, w, h, 3, poly).count, `trial ${trial}: ${JSON.stringify(poly)}`).toBe(bruteCount(w, h, poly));
		}
	});

	it('scales an outline in photo pixels onto a downscaled copy (scale = display px per photo px)', () => {
		const px = image(20, 10, grey(100));
		// The photo is 40 × 20; its display copy 20 × 10. The photo's left half is the copy's left half.
		expect(meanColourInPolygon(px, 20, 10, 3, [[0, 0], [20, 0], [20, 20], [0, 20]], 0.5).count).toBe(100);
		expect(meanColourInPolygon(px, 20, 10, 3, [[0, 0], [40, 0], [40, 20], [0, 20]], 0.5).count).toBe(200);
	});

	it('reads RGBA buffers, ignoring alpha', () => {
		const px = image(4, 4, () => [200, 100, 50, 0], 4);
		const r = meanColourInPolygon(px, 4, 4, 4, [[0, 0], [4, 0], [4, 4], [0, 4]]);
		expect(r.count).toBe(16);
		nearTriple(r.linearRgb!, lin(200, 100, 50), 1e-12, 'mean');
	});
});

describe('meanColourInPolygon: the mean', () => {
	it('averages in linear light, not in gamma-encoded values (IEC 61966-2-1 decoding)', () => {
		// Half the pixels at 64, half at 192: the linear mean is the mean of the decoded values, which is
		// brighter than decoding 128, the mean of the codes.
		const px = image(10, 4, (x) => (x < 5 ? [64, 64, 64] : [192, 192, 192]));
		const r = meanColourInPolygon(px, 10, 4, 3, [[0, 0], [10, 0], [10, 4], [0, 4]]);
		const want = (srgbToLinear(64 / 255) + srgbToLinear(192 / 255)) / 2;
		expect(r.count).toBe(40);
		r.linearRgb!.forEach((v) => near(v, want, 1e-12, 'linear mean'));
		expect(want - srgbToLinear(128 / 255)).toBeGreaterThan(0.04);
	});

	it('skips near-clipped pixels (any channel ≥ 250, or all ≤ 5) and reports how many; common practice, no published source', () => {
		const values = [
			[250, 10, 10], [10, 255, 10], [10, 10, 251], [5, 5, 5], [0, 0, 0], [3, 4, 5], // skipped
			[249, 10, 10], [6, 0, 0], [0, 0, 6], [100, 100, 100], // counted
		];
		const px = image(values.length, 1, (x) => values[x]!);
		const r = meanColourInPolygon(px, values.length, 1, 3, [[0, 0], [values.length, 0], [values.length, 1], [0, 1]]);
		expect(r).toMatchObject({ count: 4, skipped: 6 });
		const counted = values.slice(6);
		r.linearRgb!.forEach((v, i) => near(v, counted.reduce((s, c) => s + srgbToLinear(c[i]! / 255), 0) / 4, 1e-12, `channel ${i}`));
	});
});

describe('empty regions', () => {
	const px = image(10, 10, grey(100));

	it('give count 0 and no mean (null, never NaN) for an outline outside the image, too short or without area', () => {
		const cases: XY[][] = [
			[[20, 20], [30, 20], [30, 30]], // outside
			[[-10, -10], [-1, -10], [-1, -1]], // outside, negative side
			[], // no points
			[[1, 1], [5, 5]], // a line
			[[1, 1], [5, 5], [9, 9]], // collinear
		];
		for (const poly of cases) {
			expect(meanColourInPolygon(px, 10, 10, 3, poly), JSON.stringify(poly)).toEqual({ linearRgb: null, count: 0, skipped: 0 });
		}
	});

	it('give no mean when every pixel inside is clipped, but say how many were skipped', () => {
		const white = image(4, 4, grey(255));
		expect(meanColourInPolygon(white, 4, 4, 3, [[0, 0], [4, 0], [4, 4], [0, 4]])).toEqual({ linearRgb: null, count: 0, skipped: 16 });
	});
});

describe('meanColourInBox', () => {
	it('averages the pixels of a box in photo px, scaled like an outline', () => {
		const px = image(10, 10, (x, y) => (x >= 2 && x < 5 && y >= 1 && y < 3 ? [90, 120, 150] : [10, 10, 10]));
		const r = meanColourInBox(px, 10, 10, 3, { x: 4, y: 2, w: 6, h: 4 }, 0.5);
		expect(r.count).toBe(6);
		nearTriple(r.linearRgb!, lin(90, 120, 150), 1e-12, 'mean');
	});

	it('gives count 0 for a box of no width', () => {
		expect(meanColourInBox(image(4, 4, grey(100)), 4, 4, 3, { x: 1, y: 1, w: 0, h: 2 }).count).toBe(0);
	});
});

describe('bad input', () => {
	const px = image(4, 4, grey(100));
	const square: XY[] = [[0, 0], [4, 0], [4, 4], [0, 4]];

	it('refuses a malformed image, outline, box or scale with a RangeError that says what is wrong', () => {
		expect(() => meanColourInPolygon(px, 4, 4, 3, [[0, 0], [Number.NaN, 0], [4, 4]])).toThrow(/Point 2 of the outline/);
		expect(() => meanColourInPolygon(px, 4, 4, 3, square, 0)).toThrow(/scale must be a positive number/);
		expect(() => meanColourInPolygon(px, 4, 4, 3, square, Number.NaN)).toThrow(RangeError);
		expect(() => meanColourInPolygon(px, 5, 4, 3, square)).toThrow(/pixel buffer holds 48 values/);
		expect(() => meanColourInPolygon(px, 4, 4, 2, square)).toThrow(/3 \(RGB\) or 4 \(RGBA\) channels/);
		expect(() => meanColourInPolygon(px, 0, 4, 3, square)).toThrow(/image size/);
		expect(() => meanColourInPolygon(px, 2.5, 4, 3, square)).toThrow(/image size/);
		expect(() => meanColourInBox(px, 4, 4, 3, { x: 0, y: 0, w: -1, h: 2 })).toThrow(/box must be/);
		expect(() => meanColourInBox(px, 4, 4, 3, { x: Number.NaN, y: 0, w: 1, h: 2 })).toThrow(RangeError);
	});
});
