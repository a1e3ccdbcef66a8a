import fs from 'node:fs';
import path from 'node:path';
import sharp from 'sharp';

/**
 * Invented photographs for the photo benchmarks and the image-pipeline test, made here rather than
 * downloaded: a jar-like
 * subject on a graded background with soft blotches and sensor grain, so the JPEG compresses (and
 * decodes) like a camera's file and not like a flat colour or pure noise. Deterministic (seeded),
 * so every run measures the same bytes.
 */
export interface TestImage {
	name: string;
	file: string;
	width: number;
	height: number;
	bytes: number;
}

export const SIZES = {
	'24 MP': { width: 6000, height: 4000 },
	'60 MP': { width: 9504, height: 6336 },
} as const;
export type SizeName = keyof typeof SIZES;

/** A seeded stream of bytes (mulberry32, four bytes a step): fast, and the same bytes every run. */
function seededBytes(n: number, seed: number): Buffer {
	const out = Buffer.alloc(n);
	let a = seed >>> 0;
	for (let i = 0; i < n; i += 4) {
		a = (a + 0x6d2b79f5) | 0;
		let t = Math.imul(a ^ (a >>> 15), 1 | a);
		t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
		t ^= t >>> 14;
		out[i] = t & 255;
		if (i + 1 < n) out[i + 1] = (t >>> 8) & 255;
		if (i + 2 < n) out[i + 2] = (t >>> 16) & 255;
		if (i + 3 < n) out[i + 3] = (t >>> 24) & 255;
	}
	return out;
}

/** Random values on a coarse grid, enlarged smoothly by libvips: soft blotches at that scale. */
async function smoothNoise(width: number, height: number, cell: number, channels: 1 | 3, seed: number): Promise<Buffer> {
	const gw = Math.ceil(width / cell);
	const gh = Math.ceil(height / cell);
	return sharp(seededBytes(gw * gh * channels, seed), { raw: { width: gw, height: gh, channels } })
		.resize(width, height, { fit: 'fill', kernel: 'cubic' })
		// sharp would write a one-band raster out as three (sRGB) unless told it is grey.
		.toColourspace(channels === 1 ? 'b-w' : 'srgb')
		.raw()
		.toBuffer();
}

/** The pixels (RGB, 3 bytes each) of one invented photograph. */
function renderRaw(coarse: Buffer, texture: Buffer, width: number, height: number, seed: number): Buffer {
	const grain = seededBytes(width * height * 3, seed + 2);
	const raw = Buffer.alloc(width * height * 3);
	const cx = width / 2;
	const cy = height * 0.52;
	const rx = width * 0.2;
	const ry = height * 0.4;
	for (let y = 0; y < height; y++) {
		const dy = (y - cy) / ry;
		for (let x = 0; x < width; x++) {
			const t = (x / width + y / height) / 2;
			const dx = (x - cx) / rx;
			const r2 = dx * dx + dy * dy;
			// Inside the "jar": a shaded subject; its rim a thin bright line, like glass catching light.
			const inside = r2 < 1 ? 1 - r2 * 0.6 : 0;
			const rim = r2 > 0.996 && r2 < 1.004 ? 70 : 0;
			const p = y * width + x;
			const i = p * 3;
			const lum = (coarse[i]! + coarse[i + 1]! + coarse[i + 2]! - 384) * 0.22 + (texture[p]! - 128) * 0.3 + rim;
			const r = (62 + 152 * t) * (1 - inside) + 176 * inside + lum + (coarse[i]! - 128) * 0.08 + (grain[i]! - 128) * 0.09;
			const g = (92 + 104 * t) * (1 - inside) + 128 * inside + lum + (coarse[i + 1]! - 128) * 0.08 + (grain[i + 1]! - 128) * 0.09;
			const b = (124 + 10 * t) * (1 - inside) + 82 * inside + lum + (coarse[i + 2]! - 128) * 0.08 + (grain[i + 2]! - 128) * 0.09;
			// A Buffer wraps on assignment (300 becomes 44), so clamp first.
			raw[i] = r < 0 ? 0 : r > 255 ? 255 : r;
			raw[i + 1] = g < 0 ? 0 : g > 255 ? 255 : g;
			raw[i + 2] = b < 0 ? 0 : b > 255 ? 255 : b;
		}
	}
	return raw;
}

async function rawOf(width: number, height: number, seed: number): Promise<Buffer> {
	// Luminance-heavy structure, as in a photograph: big soft shapes, mid texture, then grain.
	const coarse = await smoothNoise(width, height, Math.round(width / 48), 3, seed);
	const texture = await smoothNoise(width, height, 6, 1, seed + 1);
	return renderRaw(coarse, texture, width, height, seed);
}

async function encode(raw: Buffer, file: string, width: number, height: number): Promise<void> {
	await sharp(raw, { raw: { width, height, channels: 3 } })
		.jpeg({ quality: 92 })
		.withExif({
			IFD0: { Make: 'Demo Optics', Model: 'Survey 24', Software: 'meniscus-bench' },
			IFD2: { DateTimeOriginal: '2026:03:14 10:21:07', OffsetTimeOriginal: '+01:00', ExposureTime: '1/125', FNumber: '8/1' },
		})
		.toFile(file);
}

const seedOf = (width: number, height: number) => width * 65_536 + height;

/**
 * Paints `n` in binary as a row of 16 squares of 48 px (white for 1, black for 0) in the top left
 * corner: a small drawn patch that makes each file of a series different pixels and bytes.
 */
function stampNumber(raw: Buffer, width: number, n: number): void {
	const cell = 48;
	for (let bit = 0; bit < 16; bit++) {
		const v = (n >> bit) & 1 ? 255 : 0;
		for (let y = cell; y < 2 * cell; y++) {
			const row = y * width;
			for (let x = cell * (bit + 1); x < cell * (bit + 2); x++) raw.fill(v, (row + x) * 3, (row + x) * 3 + 3);
		}
	}
}

/**
 * `count` different photographs of one size in `dir`: the same invented picture, rendered once,
 * each numbered with a drawn patch (so every file has its own pixels and SHA-256), then encoded
 * as the benchmark's JPEG. Made once and reused while the folder exists.
 */
export async function numberedImages(dir: string, name: SizeName, count: number): Promise<TestImage[]> {
	fs.mkdirSync(dir, { recursive: true });
	const { width, height } = SIZES[name];
	const file = (i: number) => path.join(dir, `invented-${width}x${height}-${String(i).padStart(3, '0')}.jpg`);
	let raw: Buffer | undefined;
	const out: TestImage[] = [];
	for (let i = 0; i < count; i++) {
		if (!fs.existsSync(file(i))) {
			raw ??= await rawOf(width, height, seedOf(width, height));
			stampNumber(raw, width, i + 1);
			await encode(raw, file(i), width, height);
		}
		out.push({ name: `${name} #${i + 1}`, file: file(i), width, height, bytes: fs.statSync(file(i)).size });
	}
	return out;
}

/** The test images in `dir`, made once and reused while the folder exists. */
export async function testImages(dir: string, names: readonly SizeName[] = ['24 MP', '60 MP']): Promise<TestImage[]> {
	fs.mkdirSync(dir, { recursive: true });
	const out: TestImage[] = [];
	for (const name of names) {
		const { width, height } = SIZES[name];
		const file = path.join(dir, `invented-${width}x${height}.jpg`);
		// The seed follows the size, so an image is the same whichever sizes a run selects.
		if (!fs.existsSync(file)) await encode(await rawOf(width, height, seedOf(width, height)), file, width, height);
		out.push({ name, file, width, height, bytes: fs.statSync(file).size });
	}
	return out;
}
