import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import exifr from 'exifr';
import { afterAll, describe, expect, it } from 'vitest';
import { inspect, isDecodeError, isMachineFault, makeDerivatives, readExif, shortError, UndecodableImage } from '../../../src/lib/server/photos/pipeline.ts';
import { parseInfo, tilesForView } from '../../../src/lib/photos/iiifTiles.ts';

/**
 * The image work of an upload, on real files: EXIF orientations 1–8 come out upright, GPS never
 * reaches a derivative, the tile pyramid is valid IIIF and its tiles decode, pixel floods are
 * refused from the header.
 */
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'meniscus-pipeline-'));
afterAll(() => fs.rmSync(tmp, { recursive: true, force: true }));
let n = 0;
const fresh = () => path.join(tmp, `set-${n++}`);

// The upright picture: four flat quadrants, so any rotation or mirror shows.
const W = 96;
const H = 64;
const QUAD = { tl: [220, 30, 30], tr: [30, 200, 40], bl: [30, 40, 220], br: [240, 240, 240] } as const;
function upright(x: number, y: number): readonly number[] {
	const right = x >= W / 2;
	const bottom = y >= H / 2;
	return bottom ? (right ? QUAD.br : QUAD.bl) : right ? QUAD.tr : QUAD.tl;
}

/**
 * Where stored pixel (row r, column c) appears when displayed, per the Orientation tag's
 * definition in CIPA DC-008-2019 (Exif 2.32) §4.6.4 A, Table 13 ("the 0th row is the visual top /
 * bottom / left / right-hand side, the 0th column is the visual left / right / top / bottom").
 */
function displayed(o: number, r: number, c: number): [number, number] {
	switch (o) {
		case 1: return [c, r];
		case 2: return [W - 1 - c, r];
		case 3: return [W - 1 - c, H - 1 - r];
		case 4: return [c, H - 1 - r];
		case 5: return [r, c];
		case 6: return [W - 1 - r, c];
		case 7: return [W - 1 - r, H - 1 - c];
		case 8: return [r, H - 1 - c];
		default: throw new Error(String(o));
	}
}

/** The bytes a camera would store for the upright picture with orientation tag `o`. */
async function storedAs(o: number): Promise<string> {
	const [sw, sh] = o >= 5 ? [H, W] : [W, H];
	const raw = Buffer.alloc(sw * sh * 3);
	for (let r = 0; r < sh; r++)
		for (let c = 0; c < sw; c++) {
			const [x, y] = displayed(o, r, c);
			raw.set(upright(x, y), (r * sw + c) * 3);
		}
	const file = path.join(tmp, `orient-${o}.jpg`);
	await sharp(raw, { raw: { width: sw, height: sh, channels: 3 } }).jpeg({ quality: 98 }).withMetadata({ orientation: o }).toFile(file);
	return file;
}

async function pixel(file: string, x: number, y: number): Promise<number[]> {
	const { data, info } = await sharp(file).raw().toBuffer({ resolveWithObject: true });
	const i = (y * info.width + x) * info.channels;
	return [data[i]!, data[i + 1]!, data[i + 2]!];
}

describe('orientation', () => {
	it.each([1, 2, 3, 4, 5, 6, 7, 8])('orientation %i comes out upright in every derivative', async (o) => {
		const file = await storedAs(o);
		const seen = await inspect(file);
		expect(seen).toMatchObject({ ok: true, width: W, height: H, orientation: o });
		const dir = fresh();
		const set = await makeDerivatives(file, dir);
		const display = path.join(dir, set.find((d) => d.kind === 'display')!.path);
		expect((await sharp(display).metadata()).orientation).toBeUndefined();
		expect([set.find((d) => d.kind === 'display')!.width, set.find((d) => d.kind === 'display')!.height]).toEqual([W, H]);
		for (const [x, y, want] of [[W / 4, H / 4, QUAD.tl], [(3 * W) / 4, H / 4, QUAD.tr], [W / 4, (3 * H) / 4, QUAD.bl], [(3 * W) / 4, (3 * H) / 4, QUAD.br]] as const) {
			const got = await pixel(display, x, y);
			got.forEach((v, i) => expect(Math.abs(v - want[i]!), `orientation ${o} at ${x},${y}: ${got}`).toBeLessThan(24));
		}
	});
});

describe('metadata', () => {
	it('keeps GPS and serial numbers with the master and strips them from every derivative', async () => {
		const file = path.join(tmp, 'gps.jpg');
		await sharp({ create: { width: 640, height: 480, channels: 3, background: '#6a8' } })
			.jpeg()
			.withExif({ IFD0: { Make: 'Demo Optics', Model: 'Survey 24' }, IFD2: { BodySerialNumber: 'SN-1' }, IFD3: { GPSLatitudeRef: 'S', GPSLatitude: '33/1 52/1 0/1', GPSLongitudeRef: 'E', GPSLongitude: '151/1 12/1 36/1' } })
			.toFile(file);
		const exif = await readExif(file);
		// 33° 52′ S = −33.8667; 151° 12′ 36″ E = 151.21 (degrees + minutes/60 + seconds/3600).
		expect(exif.private.gps?.latitude).toBeCloseTo(-33.866667, 5);
		expect(exif.private.gps?.longitude).toBeCloseTo(151.21, 5);
		expect(exif.private.bodySerial).toBe('SN-1');
		const dir = fresh();
		const set = await makeDerivatives(file, dir);
		for (const d of set.filter((s) => s.kind !== 'tiles')) {
			const f = path.join(dir, d.path);
			expect(await exifr.parse(f, { gps: true, tiff: true, exif: true }).catch(() => undefined), d.kind).toBeUndefined();
			expect((await sharp(f).metadata()).exif).toBeUndefined();
		}
		const tile = path.join(dir, 'tiles', 'full');
		const anyTile = fs.readdirSync(tile, { recursive: true }).map(String).find((p) => p.endsWith('.jpg'))!;
		expect((await sharp(path.join(tile, anyTile)).metadata()).exif).toBeUndefined();
	});
});

describe('the tile pyramid', () => {
	it('is a valid IIIF Image API 3 level-0 service whose every tile exists and decodes at its stated size', async () => {
		const file = path.join(tmp, 'big.jpg');
		await sharp({ create: { width: 3000, height: 2000, channels: 3, background: '#345' } }).jpeg().toFile(file);
		const dir = fresh();
		await makeDerivatives(file, dir);
		const json = JSON.parse(fs.readFileSync(path.join(dir, 'tiles', 'info.json'), 'utf8'));
		// IIIF Image API 3.0 §5.1–5.6: required @context, id, type, protocol, profile, width, height.
		expect(json).toMatchObject({ '@context': 'http://iiif.io/api/image/3/context.json', type: 'ImageService3', protocol: 'http://iiif.io/api/image', profile: 'level0', width: 3000, height: 2000 });
		const info = parseInfo(json);
		expect(fs.existsSync(path.join(dir, 'vips-properties.xml'))).toBe(false);
		for (const sf of info.tiles[0]!.scaleFactors) {
			const tiles = tilesForView(info, { x: 0, y: 0, w: 3000, h: 2000 }, 1 / sf);
			expect(tiles.length).toBeGreaterThan(0);
			for (const t of tiles) {
				const m = await sharp(path.join(dir, 'tiles', t.path)).metadata();
				expect([m.width, m.height], t.path).toEqual([t.sizeW, t.sizeH]);
			}
		}
	});
});

describe('inspection before decoding', () => {
	it('refuses a pixel flood from the header alone', async () => {
		// A JPEG header (SOF0) can declare up to 65,535 × 65,535; sharp reads it without decoding.
		const small = await sharp({ create: { width: 16, height: 16, channels: 3, background: '#000' } }).jpeg().toBuffer();
		const sof = small.indexOf(Buffer.from([0xff, 0xc0]));
		const forged = Buffer.from(small);
		forged.writeUInt16BE(60000, sof + 5); // height
		forged.writeUInt16BE(60000, sof + 7); // width
		const file = path.join(tmp, 'flood.jpg');
		fs.writeFileSync(file, forged);
		const seen = await inspect(file);
		expect(seen.ok).toBe(false);
		if (!seen.ok) expect(seen.refusal).toMatchObject({ code: 'too-many-pixels' });
		expect(!seen.ok && seen.refusal.reason).toMatch(/3,600 megapixels.*limit is 200/);
	});

	it('refuses a HEIC photo by name of its format, since sharp here cannot decode it', async () => {
		const heic = Buffer.concat([Buffer.from([0, 0, 0, 0x18]), Buffer.from('ftypheic'), Buffer.alloc(4), Buffer.from('mif1heic'), Buffer.alloc(64)]);
		const file = path.join(tmp, 'x.heic');
		fs.writeFileSync(file, heic);
		const seen = await inspect(file);
		expect(!seen.ok && seen.refusal.code).toBe('heic');
	});
});

describe('refusal wording', () => {
	it('never names a server path, whatever libvips put in its message (ASVS 5.0 16.5.1)', () => {
		expect(shortError(new Error('Input file has corrupt header: /tmp/meniscus-x/incoming/ab12: bad seek to 1730\nmore'))).toBe('Input file has corrupt header: the file: bad seek to 1730');
		expect(shortError(new Error('VipsForeignLoad: "/srv/uploads/incoming/ab12" is not a known file format'))).toBe('VipsForeignLoad: the file is not a known file format');
		expect(shortError(new Error('Unknown error'))).toBe('Unknown error');
	});
	it('tells a damaged file from a machine fault', () => {
		expect(isDecodeError(new UndecodableImage(new Error('Unknown error')))).toBe(true);
		expect(isDecodeError(Object.assign(new Error('write failed'), { code: 'ENOSPC' }))).toBe(false);
		expect(isMachineFault(new Error('VipsForeignSaveJpeg: No space left on device'))).toBe(true);
		expect(isMachineFault(new Error('VipsJpeg: Premature end of input file'))).toBe(false);
	});
});
