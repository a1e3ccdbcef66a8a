import { describe, expect, it } from 'vitest';
import sharp from 'sharp';
import exifr from 'exifr';
import {
	jarPhotoSvg,
	renderJarPhoto,
	type JarPhotoParams,
	type JarPhotoTruth,
	type JarShape,
	type SpecimenSilhouette,
} from '../../db/seeders/photos/drawJar.ts';
import { captureInstant, summariseExif } from '../../src/lib/photos/exif.ts';

/** The renderer draws invented demo photographs; these tests hold it to what its truth claims. */
const base: JarPhotoParams = {
	seed: 1898014,
	shape: 'cylinder',
	silhouette: 'frog',
	seal: 'pitch',
	objectNumber: 'STC.1898.014',
	fluidFill: 0.7,
	fluidColour: [232, 218, 160],
	captureTime: { local: '2019:06:14 10:32:05', offset: '+01:00' },
};

type Box = { x: number; y: number; w: number; h: number };

/** Mean sRGB of a region (rounded inwards to whole pixels). */
async function meanRgb(jpeg: Buffer, b: Box): Promise<[number, number, number]> {
	const left = Math.ceil(b.x);
	const top = Math.ceil(b.y);
	const region = { left, top, width: Math.floor(b.x + b.w) - left, height: Math.floor(b.y + b.h) - top };
	// stats() measures the input, not the pipeline: sharp(jpeg).extract(r).stats() gives the whole
	// photo's means. The region has to be cut out into its own image first.
	const cut = await sharp(jpeg).extract(region).toBuffer();
	const { channels } = await sharp(cut).stats();
	const [r, g, bl] = channels;
	return [r?.mean ?? NaN, g?.mean ?? NaN, bl?.mean ?? NaN];
}

/**
 * A band clear of the specimen, label and glass highlights: 13.5–16.5 % across the jar's outer box
 * (the renderer keeps that band free for exactly this).
 */
const sampleX = (t: JarPhotoTruth) => ({ x: t.jar.x + 0.135 * t.jar.w, w: 0.03 * t.jar.w });

const overlaps = (a: Box, b: Box) => a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h;

describe('renderJarPhoto', () => {
	it('writes a JPEG of the stated size, in about the time the seeder can afford', async () => {
		const t0 = performance.now();
		const { jpeg, truth } = await renderJarPhoto(base);
		const ms = performance.now() - t0;
		const meta = await sharp(jpeg).metadata();
		expect(meta.format).toBe('jpeg');
		expect([meta.width, meta.height]).toEqual([1600, 2000]);
		expect([truth.width, truth.height]).toEqual([1600, 2000]);
		// Generous: the real figure is a few hundred ms, but test machines are shared.
		expect(ms).toBeLessThan(5000);
	});

	it('honours a non-default frame size', async () => {
		const { jpeg, truth } = await renderJarPhoto({ ...base, width: 1200, height: 900 });
		const meta = await sharp(jpeg).metadata();
		expect([meta.width, meta.height]).toEqual([1200, 900]);
		expect([truth.width, truth.height]).toEqual([1200, 900]);
	});

	it('carries the capture time, its offset and the invented camera in EXIF', async () => {
		const { jpeg } = await renderJarPhoto(base);
		const tags = await exifr.parse(jpeg, { reviveValues: false, translateValues: false });
		expect(tags.DateTimeOriginal).toBe('2019:06:14 10:32:05');
		expect(tags.OffsetTimeOriginal).toBe('+01:00');
		expect(tags.Make).toBe('Demo Optics');
		expect(tags.Model).toBe('Survey 24');
		expect(tags.LensModel).toBe('Demo 50mm F2.8 Macro');
		expect(tags.FocalLength).toBe(50);
		expect(tags.ImageDescription).toBe('Invented demo photograph of STC.1898.014, front view');
		expect(tags.ISO).toBeGreaterThan(0);
	});

	it('reads back through the app\'s own EXIF summary as a dated capture from the invented camera', async () => {
		const { jpeg } = await renderJarPhoto(base);
		// The options readExif() uses for uploads.
		const tags = await exifr.parse(jpeg, { tiff: true, exif: true, gps: true, ifd1: false, interop: false, xmp: false, icc: false, iptc: false, reviveValues: false, translateValues: false, mergeOutput: true });
		const e = summariseExif(tags);
		expect(e.capture).toEqual({ raw: '2019:06:14 10:32:05', offset: '+01:00', subSec: null });
		expect(captureInstant(e.capture.raw, e.capture.offset)?.toISOString()).toBe('2019-06-14T09:32:05.000Z');
		expect(e.camera).toEqual({ make: 'Demo Optics', model: 'Survey 24' });
		expect(e.lens.model).toBe('Demo 50mm F2.8 Macro');
		expect(e.exposure.focalLengthMm).toBe(50);
		expect(e.exposure.exposureTime).toBeGreaterThan(0);
		expect(e.exposure.fNumber).toBeGreaterThanOrEqual(8);
		expect(e.orientation).toBe(1);
		expect(e.private.gps).toBeNull();
	});

	it('shows an 18% grey card that measures 119,119,119 (±3)', async () => {
		const { jpeg, truth } = await renderJarPhoto(base);
		const c = truth.greyCard;
		// A few pixels in from the edges, where JPEG blocks mix in the white mount.
		const mean = await meanRgb(jpeg, { x: c.x + 8, y: c.y + 8, w: c.w - 16, h: c.h - 16 });
		for (const v of mean) expect(Math.abs(v - 119)).toBeLessThanOrEqual(3);
	});

	it('moves its truth with the camera: the grey card and the fluid line are where it says after a zoom and a shift', async () => {
		const camera = { zoom: 1.06, dx: 35, dy: -28 };
		const still = jarPhotoSvg(base).truth;
		const { jpeg, truth } = await renderJarPhoto({ ...base, camera });
		// Magnified about the centre (800, 1000) and moved: x' = 1.06·(x − 800) + 800 + 35.
		expect(truth.greyCard.x).toBeCloseTo(1.06 * (still.greyCard.x - 800) + 835, 1);
		expect(truth.fluidLineY).toBeCloseTo(1.06 * (still.fluidLineY - 1000) + 972, 1);
		expect(truth.pxPerMm).toBeCloseTo(still.pxPerMm * 1.06, 9);
		const c = truth.greyCard;
		for (const v of await meanRgb(jpeg, { x: c.x + 8, y: c.y + 8, w: c.w - 16, h: c.h - 16 })) expect(Math.abs(v - 119)).toBeLessThanOrEqual(3);
		const { x, w } = sampleX(truth);
		const below = await meanRgb(jpeg, { x, w, y: truth.fluidLineY + 10, h: 30 });
		below.forEach((v, i) => expect(Math.abs(v - base.fluidColour[i]!)).toBeLessThan(25));
		expect(() => jarPhotoSvg({ ...base, camera: { zoom: 0.9, dx: 0, dy: 0 } })).toThrow(RangeError);
	});

	it('draws the fluid up to fluidLineY: fluid colour below it, something else above', async () => {
		for (const fluidColour of [[232, 218, 160], [150, 86, 30]] as [number, number, number][]) {
			const { jpeg, truth } = await renderJarPhoto({ ...base, fluidColour });
			const { x, w } = sampleX(truth);
			const below = await meanRgb(jpeg, { x, w, y: truth.fluidLineY + 10, h: 30 });
			// Above the meniscus and the far edge of the surface ellipse, below the seal.
			const above = await meanRgb(jpeg, { x, w, y: truth.fluidLineY - 70, h: 30 });
			// Loosely: glass, edge shading and a little of the backdrop through the fluid shift it.
			below.forEach((v, i) => expect(Math.abs(v - (fluidColour[i] ?? 0)), `channel ${i} of ${fluidColour.join(',')}`).toBeLessThan(25));
			const diff = above.reduce((s, v, i) => s + Math.abs(v - (below[i] ?? 0)), 0);
			expect(diff).toBeGreaterThan(30);
		}
	});

	it('is deterministic: the same parameters give the same bytes', async () => {
		const a = await renderJarPhoto({ ...base, seed: 42, silhouette: 'cephalopod' });
		const b = await renderJarPhoto({ ...base, seed: 42, silhouette: 'cephalopod' });
		expect(a.jpeg.equals(b.jpeg)).toBe(true);
		expect(a.truth).toEqual(b.truth);
	});
});

describe('jarPhotoSvg geometry', () => {
	const shapes: JarShape[] = ['cylinder', 'rectangular', 'oval'];
	const views = ['front', 'back', 'left', 'right', 'top', 'detail'] as const;
	const silhouettes: SpecimenSilhouette[] = ['fish', 'frog', 'snake', 'organ', 'cephalopod', 'generic'];

	it('puts the fluid line lower as the fill goes down, in every view', () => {
		for (const view of views) {
			for (const shape of shapes) {
				const ys = [1, 0.8, 0.5, 0.2, 0].map((fluidFill) => jarPhotoSvg({ ...base, view, shape, fluidFill }).truth.fluidLineY);
				for (let i = 1; i < ys.length; i++) expect(ys[i]!, `${view} ${shape}`).toBeGreaterThan(ys[i - 1]!);
				const t = jarPhotoSvg({ ...base, view, shape, fluidFill: 0 }).truth;
				expect(t.fluidLineY).toBe(t.innerBaseY);
			}
		}
	});

	it('gives pxPerMm from the scale bar: its length in px / its length in mm (about 6 by default)', () => {
		const front = jarPhotoSvg(base).truth;
		expect(front.scaleBar.lengthMm).toBe(100);
		expect(front.pxPerMm).toBeCloseTo(6, 6);
		for (const view of views) {
			const { scaleBar, pxPerMm } = jarPhotoSvg({ ...base, view }).truth;
			const px = Math.hypot(scaleBar.to[0] - scaleBar.from[0], scaleBar.to[1] - scaleBar.from[1]);
			expect(px / 100, view).toBeCloseTo(pxPerMm, 6);
		}
	});

	it('keeps scale bar and grey card in frame, and the card clear of the jar', () => {
		for (const view of views) {
			for (const shape of shapes) {
				for (const seed of [1, 2, 3, 4, 5]) {
					for (const [width, height] of [[1600, 2000], [1200, 900], [800, 1000]] as const) {
						const t = jarPhotoSvg({ ...base, view, shape, seed, width, height }).truth;
						const what = `${view} ${shape} seed ${seed} ${width}×${height}`;
						const c = t.greyCard;
						expect(c.x >= 0 && c.y >= 0 && c.x + c.w <= width && c.y + c.h <= height, `card in frame: ${what}`).toBe(true);
						expect(overlaps(c, t.jar), `card clear of jar: ${what}`).toBe(false);
						for (const [x, y] of [t.scaleBar.from, t.scaleBar.to]) expect(x >= 0 && x <= width && y >= 0 && y <= height, `scale in frame: ${what}`).toBe(true);
					}
				}
			}
		}
	});

	it('puts the specimen top where specimenTopFraction says, and the fluid line where fluidFill says', () => {
		for (const silhouette of silhouettes) {
			const t = jarPhotoSvg({ ...base, silhouette, specimenTopFraction: 0.6, fluidFill: 0.5 }).truth;
			const innerTop = t.innerBaseY - (t.innerBaseY - t.fluidLineY) / 0.5;
			expect(t.specimenTopY).toBeCloseTo(t.innerBaseY - 0.6 * (t.innerBaseY - innerTop), 1);
			expect(innerTop).toBeGreaterThan(t.jar.y);
		}
	});

	it('escapes the object number and refuses nonsense', () => {
		expect(jarPhotoSvg({ ...base, objectNumber: 'A&B<1>' }).svg).toContain('A&amp;B&lt;1&gt;');
		expect(() => jarPhotoSvg({ ...base, fluidFill: 1.2 })).toThrow(RangeError);
		expect(() => jarPhotoSvg({ ...base, captureTime: { local: '2019-06-14T10:32:05', offset: '+01:00' } })).toThrow(RangeError);
	});
});
