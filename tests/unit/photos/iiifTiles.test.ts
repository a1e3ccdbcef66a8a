import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import fc from 'fast-check';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { chooseScaleFactor, type IiifInfo, parseInfo, tilePath, tilesForView } from '../../../src/lib/photos/iiifTiles.ts';

/**
 * Real pyramids, written by sharp exactly as the server does (layout iiif3, 512-pixel tiles), so the
 * paths computed here are checked against what is on disk. Sizes: a 16.5 MP photo, an odd size, a
 * 1-pixel edge column and row, a tall narrow image, an exact single tile and an exact 2×2 grid.
 */
const SIZES = {
	big: [5000, 3300],
	odd: [1234, 777],
	edge: [1025, 513],
	tall: [300, 3000],
	exact: [512, 512],
	square: [1024, 1024],
} as const;
type Name = keyof typeof SIZES;

let tmp = '';
const raw: Partial<Record<Name, unknown>> = {};
const info: Partial<Record<Name, IiifInfo>> = {};
const dir = (name: Name) => path.join(tmp, name);

/** Every tile file under a pyramid folder, as a path relative to it (the folder holding info.json). */
function filesOnDisk(root: string): string[] {
	const out: string[] = [];
	const walk = (d: string) => {
		for (const e of fs.readdirSync(d, { withFileTypes: true })) {
			const p = path.join(d, e.name);
			if (e.isDirectory()) walk(p);
			else if (e.name !== 'info.json') out.push(path.relative(root, p).split(path.sep).join('/'));
		}
	};
	walk(root);
	return out.sort();
}
const fullView = (i: IiifInfo) => ({ x: 0, y: 0, w: i.width, h: i.height });

beforeAll(async () => {
	tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'meniscus-iiif-'));
	for (const [name, [width, height]] of Object.entries(SIZES) as [Name, readonly [number, number]][]) {
		await sharp({ create: { width, height, channels: 3, background: '#888' } })
			.tile({ layout: 'iiif3', size: 512, id: 'https://example.org/iiif' })
			.toFile(dir(name));
		raw[name] = JSON.parse(fs.readFileSync(path.join(dir(name), 'info.json'), 'utf8'));
		info[name] = parseInfo(raw[name]);
	}
}, 60_000);
afterAll(() => {
	if (tmp) fs.rmSync(tmp, { recursive: true, force: true });
});

describe('what sharp writes (the facts iiifTiles.ts relies on)', () => {
	it('info.json: IIIF Image API 3, level 0, square 512 tiles, scale factors up to one tile', () => {
		expect(raw.big).toEqual({
			'@context': 'http://iiif.io/api/image/3/context.json',
			id: 'https://example.org/iiif/big',
			type: 'ImageService3',
			profile: 'level0',
			protocol: 'http://iiif.io/api/image',
			tiles: [{ scaleFactors: [1, 2, 4, 8, 16], width: 512 }],
			width: 5000,
			height: 3300,
		});
		expect(info.odd!.tiles[0]!.scaleFactors).toEqual([1, 2, 4]);
		expect(info.edge!.tiles[0]!.scaleFactors).toEqual([1, 2, 4]);
		expect(info.tall!.tiles[0]!.scaleFactors).toEqual([1, 2, 4, 8]);
		expect(info.square!.tiles[0]!.scaleFactors).toEqual([1, 2]);
		expect(info.exact!.tiles[0]!.scaleFactors).toEqual([1]);
	});
	it('the whole-image tile is under full/, and there is no max size folder', () => {
		expect(filesOnDisk(dir('exact'))).toEqual(['full/512,512/0/default.jpg']);
		expect(filesOnDisk(dir('big')).filter((p) => p.startsWith('full/'))).toEqual(['full/313,207/0/default.jpg']);
		expect(fs.existsSync(path.join(dir('big'), '0,0,5000,3300'))).toBe(false);
		expect(filesOnDisk(dir('big')).some((p) => p.includes('max'))).toBe(false);
	});
});

describe('tilesForView over the whole image, against the files on disk', () => {
	it.each(Object.keys(SIZES) as Name[])('%s: every level’s tiles exist, and together they are exactly the files sharp wrote', (name) => {
		const i = info[name]!;
		const onDisk = new Set(filesOnDisk(dir(name)));
		const predicted: string[] = [];
		for (const s of i.tiles[0]!.scaleFactors) {
			const level = tilesForView(i, fullView(i), 1 / s);
			expect(level.every((t) => t.scaleFactor === s)).toBe(true);
			for (const t of level) expect(onDisk.has(t.path), `${name}: ${t.path}`).toBe(true);
			// The level's tiles tile the image: no gaps, no overlaps.
			expect(level.reduce((a, t) => a + t.region.w * t.region.h, 0)).toBe(i.width * i.height);
			predicted.push(...level.map((t) => t.path));
		}
		// Levels are disjoint and their union is the directory: each file on disk is one level's tile.
		expect(new Set(predicted).size).toBe(predicted.length);
		expect([...predicted].sort()).toEqual([...onDisk].sort());
	});

	it('every tile file has the pixel size its TileRef says (edge tiles clipped, rounded up)', async () => {
		for (const name of ['odd', 'edge', 'tall', 'big'] as Name[]) {
			const i = info[name]!;
			for (const s of i.tiles[0]!.scaleFactors) {
				for (const t of tilesForView(i, fullView(i), 1 / s)) {
					const m = await sharp(path.join(dir(name), t.path)).metadata();
					expect([m.width, m.height], `${name}: ${t.path}`).toEqual([t.sizeW, t.sizeH]);
				}
			}
		}
	});
});

describe('tilePath', () => {
	it('gives the paths sharp writes, including clipped edge tiles', () => {
		const big = info.big!;
		expect(tilePath(big, 1, 0, 0)).toEqual({ scaleFactor: 1, region: { x: 0, y: 0, w: 512, h: 512 }, sizeW: 512, sizeH: 512, path: '0,0,512,512/512,512/0/default.jpg' });
		expect(tilePath(big, 1, 9, 6).path).toBe('4608,3072,392,228/392,228/0/default.jpg');
		expect(tilePath(big, 4, 1, 1).path).toBe('2048,2048,2048,1252/512,313/0/default.jpg');
		expect(tilePath(big, 8, 1, 0)).toMatchObject({ region: { x: 4096, y: 0, w: 904, h: 3300 }, sizeW: 113, sizeH: 413, path: '4096,0,904,3300/113,413/0/default.jpg' });
		expect(tilePath(big, 16, 0, 0)).toMatchObject({ region: { x: 0, y: 0, w: 5000, h: 3300 }, path: 'full/313,207/0/default.jpg' });
		expect(tilePath(info.edge!, 1, 2, 1).path).toBe('1024,512,1,1/1,1/0/default.jpg');
		expect(tilePath(info.edge!, 2, 1, 0).path).toBe('1024,0,1,513/1,257/0/default.jpg');
		expect(tilePath(info.odd!, 2, 1, 0).path).toBe('1024,0,210,777/105,389/0/default.jpg');
	});
	it('refuses a tile outside the grid or a scale factor that is not there', () => {
		expect(() => tilePath(info.big!, 1, 10, 0)).toThrow(RangeError);
		expect(() => tilePath(info.big!, 1, 0, 7)).toThrow(RangeError);
		expect(() => tilePath(info.big!, 16, 1, 0)).toThrow(RangeError);
		expect(() => tilePath(info.big!, 1, -1, 0)).toThrow(RangeError);
		expect(() => tilePath(info.big!, 1, 0.5, 0)).toThrow(RangeError);
		expect(() => tilePath(info.big!, 3, 0, 0)).toThrow(/scale factor 3.*1, 2, 4, 8, 16/);
	});
	it('handles non-square tiles and several tile entries in another server’s info.json', () => {
		const other: IiifInfo = { width: 1000, height: 1000, tiles: [{ width: 256, height: 128, scaleFactors: [1] }, { width: 512, scaleFactors: [2, 4] }] };
		expect(tilePath(other, 1, 3, 7).path).toBe('768,896,232,104/232,104/0/default.jpg');
		expect(tilePath(other, 2, 0, 0).path).toBe('full/500,500/0/default.jpg');
		expect(tilesForView(other, { x: 0, y: 0, w: 1000, h: 1000 }, 1)).toHaveLength(4 * 8);
	});
});

describe('chooseScaleFactor', () => {
	it('takes the coarsest level that is still at least as sharp as the screen', () => {
		const big = info.big!;
		expect(chooseScaleFactor(big, 1)).toBe(1);
		expect(chooseScaleFactor(big, 0.5)).toBe(2);
		expect(chooseScaleFactor(big, 0.3)).toBe(2); // factor 4 would give 1.2 screen px per tile px: blurry
		expect(chooseScaleFactor(big, 0.25)).toBe(4);
		expect(chooseScaleFactor(big, 1 / 3)).toBe(2);
		expect(chooseScaleFactor(big, 0.001)).toBe(16);
		expect(chooseScaleFactor(big, 4)).toBe(1); // zoomed in beyond full resolution
		expect(chooseScaleFactor(info.exact!, 0.01)).toBe(1);
	});
	it('refuses a zoom that is not a positive number', () => {
		for (const z of [0, -1, Number.NaN]) expect(() => chooseScaleFactor(info.big!, z)).toThrow(RangeError);
	});
});

describe('tilesForView for part of the image', () => {
	it('a small view inside one tile gives that tile only', () => {
		expect(tilesForView(info.big!, { x: 600, y: 600, w: 100, h: 100 }, 1).map((t) => t.path)).toEqual(['512,512,512,512/512,512/0/default.jpg']);
	});
	it('a view across tile edges gives the tiles it touches, row by row', () => {
		expect(tilesForView(info.big!, { x: 1000, y: 1000, w: 100, h: 100 }, 1).map((t) => t.path)).toEqual([
			'512,512,512,512/512,512/0/default.jpg',
			'1024,512,512,512/512,512/0/default.jpg',
			'512,1024,512,512/512,512/0/default.jpg',
			'1024,1024,512,512/512,512/0/default.jpg',
		]);
	});
	it('a view ending exactly on a tile edge does not fetch the next tile', () => {
		expect(tilesForView(info.big!, { x: 500, y: 0, w: 12, h: 10 }, 1).map((t) => t.region.x)).toEqual([0]);
		expect(tilesForView(info.big!, { x: 512, y: 0, w: 10, h: 10 }, 1).map((t) => t.region.x)).toEqual([512]);
	});
	it('is clamped to the image, and empty outside it', () => {
		expect(tilesForView(info.big!, { x: -3000, y: -3000, w: 3100, h: 3100 }, 1).map((t) => t.path)).toEqual(['0,0,512,512/512,512/0/default.jpg']);
		expect(tilesForView(info.big!, { x: 4900, y: 3200, w: 1000, h: 1000 }, 1).map((t) => t.path)).toEqual(['4608,3072,392,228/392,228/0/default.jpg']);
		expect(tilesForView(info.big!, { x: 6000, y: 0, w: 100, h: 100 }, 1)).toEqual([]);
		expect(tilesForView(info.big!, { x: 0, y: 0, w: 0, h: 100 }, 1)).toEqual([]);
		expect(tilesForView(info.big!, { x: 0, y: 0, w: Infinity, h: Infinity }, 0.01).map((t) => t.path)).toEqual(['full/313,207/0/default.jpg']);
		expect(() => tilesForView(info.big!, { x: Number.NaN, y: 0, w: 1, h: 1 }, 1)).toThrow(RangeError);
	});
	it('at a zoomed-out level, uses that level’s tiles', () => {
		const tiles = tilesForView(info.big!, { x: 0, y: 0, w: 5000, h: 1000 }, 0.25);
		expect(tiles.map((t) => t.path)).toEqual(['0,0,2048,2048/512,512/0/default.jpg', '2048,0,2048,2048/512,512/0/default.jpg', '4096,0,904,2048/226,512/0/default.jpg']);
	});
	it('always covers the visible part with tiles that each touch it (any view, any zoom)', () => {
		const big = info.big!;
		fc.assert(
			fc.property(
				fc.integer({ min: -6000, max: 6000 }),
				fc.integer({ min: -4000, max: 4000 }),
				fc.integer({ min: 1, max: 8000 }),
				fc.integer({ min: 1, max: 8000 }),
				fc.double({ min: 0.001, max: 8, noNaN: true }),
				(x, y, w, h, zoom) => {
					const tiles = tilesForView(big, { x, y, w, h }, zoom);
					const x0 = Math.max(0, x);
					const y0 = Math.max(0, y);
					const x1 = Math.min(big.width, x + w);
					const y1 = Math.min(big.height, y + h);
					if (x1 <= x0 || y1 <= y0) return tiles.length === 0;
					const inter = (t: (typeof tiles)[number]) =>
						Math.max(0, Math.min(x1, t.region.x + t.region.w) - Math.max(x0, t.region.x)) * Math.max(0, Math.min(y1, t.region.y + t.region.h) - Math.max(y0, t.region.y));
					// Each tile overlaps the view, and the overlaps add up to the whole visible area.
					return tiles.every((t) => inter(t) > 0) && tiles.reduce((a, t) => a + inter(t), 0) === (x1 - x0) * (y1 - y0);
				},
			),
			{ numRuns: 300 },
		);
	});
});

describe('parseInfo', () => {
	it('keeps the fields used, sorted, and ignores the rest', () => {
		expect(parseInfo({ ...(raw.odd as object), sizes: [{ width: 100, height: 63 }] })).toEqual({ width: 1234, height: 777, tiles: [{ width: 512, scaleFactors: [1, 2, 4] }] });
		expect(parseInfo({ width: 10, height: 10, tiles: [{ width: 256, height: 128, scaleFactors: [4, 1, 2, 2] }] }).tiles[0]).toEqual({ width: 256, height: 128, scaleFactors: [1, 2, 4] });
	});
	it.each([
		[null, /not usable/],
		['info', /not usable/],
		[{ width: 10, height: 10 }, /tiles/],
		[{ width: 10, height: 10, tiles: [] }, /tiles must not be empty/],
		[{ width: '10', height: 10, tiles: [{ width: 512, scaleFactors: [1] }] }, /width must be a number/],
		[{ width: -10, height: 10, tiles: [{ width: 512, scaleFactors: [1] }] }, /width must be greater than 0/],
		[{ width: 10.5, height: 10, tiles: [{ width: 512, scaleFactors: [1] }] }, /whole number/],
		[{ width: 10, height: 10, tiles: [{ width: 512, scaleFactors: [] }] }, /scaleFactors must not be empty.*tiles\.0\.scaleFactors/],
		[{ width: 10, height: 10, tiles: [{ width: 512, scaleFactors: [0] }] }, /scale factor must be greater than 0/],
		[{ width: 10, height: 10, tiles: [{ scaleFactors: [1] }] }, /tile width/],
	])('refuses %j with a clear message', (json, message) => {
		expect(() => parseInfo(json)).toThrow(message);
	});
});
