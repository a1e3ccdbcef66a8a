import { z } from 'zod';

/**
 * Which IIIF tiles the viewer loads for what is on screen, for the static (level 0) tile pyramids the
 * server writes with `sharp(input).tile({ layout: 'iiif3', size: 512, id })`. Pure TypeScript: it runs
 * in the browser viewer and in server-side tests alike.
 *
 * What sharp writes (found with 0.34.5 and libvips 8.17.3, unchanged in 0.35.5 and libvips 8.18.7), by generating pyramids (5000×3300, 1234×777,
 * 1025×513, 1024×1024, 300×3000, 512×512, 300×200, 1×1) and reading the directories; the unit tests
 * check every path below against real output, so a sharp upgrade that changes it fails them:
 *
 * - `<out>/info.json`: `{"@context": "http://iiif.io/api/image/3/context.json", "id": "<id>/<out
 *   basename>", "type": "ImageService3", "profile": "level0", "protocol": "http://iiif.io/api/image",
 *   "tiles": [{"scaleFactors": [1, 2, 4, …], "width": 512}], "width": W, "height": H}`.
 *   No tile `height` (so tiles are square: IIIF Image API 3.0 "tiles", a missing height equals the
 *   width, from memory), no `sizes`, no `preferredFormats`.
 *   Note the id gets the output folder's name appended (a `.dz` suffix on it is dropped), and without
 *   an `id` option it is `https://example.com/iiif/<basename>`.
 * - Scale factors are 1, 2, 4, … up to the first level where the whole image fits in one tile (libvips
 *   depth "onetile"): 5000×3300 → [1, 2, 4, 8, 16]; 1234×777 → [1, 2, 4]; 1024×1024 → [1, 2];
 *   512×512 and smaller → [1].
 * - Each tile is `<region>/<size>/0/default.jpg`: region `x,y,w,h` in full-image pixels, a multiple
 *   of 512 × scale factor, clipped to the image at the right and bottom edges; size `w,h` (both given)
 *   = the region divided by the scale factor, rounded up; rotation always `0`; quality `default`; the
 *   extension follows sharp's output format (`.jpg` unless `.webp()`/`.png()` is set before `.tile()`).
 *   Examples for 5000×3300: `4608,3072,392,228/392,228/0/default.jpg` (edge tile, factor 1),
 *   `4096,0,904,3300/113,413/0/default.jpg` (factor 8).
 * - The top level, whose single tile is the whole image, is written with region `full`, e.g.
 *   `full/313,207/0/default.jpg` for 5000×3300 at factor 16, and there is no `0,0,5000,3300/…` folder.
 *   For a photo that fits in one tile that is the only file (`full/300,200/0/default.jpg`). This
 *   follows the IIIF canonical URI syntax, where the region is `full` when it is the whole image
 *   (Image API "Canonical URI Syntax", from memory); the size stays `w,h` there too.
 * - No `max` size folder and no other `full/` sizes exist; there is nothing to fetch except the tiles.
 * - libvips also writes a `vips-properties.xml` next to the output folder (in its parent directory),
 *   not inside it.
 */

export interface IiifInfo {
	width: number;
	height: number;
	tiles: { width: number; height?: number; scaleFactors: number[] }[];
}
/** A rectangle in full-resolution image pixels. */
export interface ImageRect {
	x: number;
	y: number;
	w: number;
	h: number;
}
/** One tile: where it is in the full image, its size in pixels as stored, and its path relative to
 * the image service base (the folder holding info.json), exactly as sharp writes it. */
export interface TileRef {
	scaleFactor: number;
	region: ImageRect;
	sizeW: number;
	sizeH: number;
	path: string;
}

/** The tile file extension sharp writes for its default (JPEG) tile output. */
export const TILE_SUFFIX = 'jpg';

const positiveInt = (what: string) => z.number({ message: `${what} must be a number.` }).int(`${what} must be a whole number.`).positive(`${what} must be greater than 0.`);

const InfoSchema = z.object({
	width: positiveInt('width'),
	height: positiveInt('height'),
	tiles: z
		.array(
			z.object({
				width: positiveInt('tile width'),
				height: positiveInt('tile height').optional(),
				scaleFactors: z.array(positiveInt('scale factor'), { message: 'scaleFactors must be a list of numbers.' }).min(1, 'scaleFactors must not be empty.'),
			}),
			{ message: 'tiles must be a list.' },
		)
		.min(1, 'tiles must not be empty; this viewer needs a tiled image.'),
});

/** The parts of an IIIF Image API 3 info.json this viewer uses; throws an Error saying what is wrong. */
export function parseInfo(json: unknown): IiifInfo {
	const r = InfoSchema.safeParse(json);
	if (!r.success) {
		const first = r.error.issues[0];
		const where = first?.path.length ? ` (at ${first.path.join('.')})` : '';
		throw new Error(`The image description (info.json) is not usable: ${first?.message ?? 'unexpected shape'}${where}`);
	}
	return {
		width: r.data.width,
		height: r.data.height,
		tiles: r.data.tiles.map((t) => ({
			width: t.width,
			...(t.height !== undefined ? { height: t.height } : {}),
			scaleFactors: [...new Set(t.scaleFactors)].sort((a, b) => a - b),
		})),
	};
}

function allScaleFactors(info: IiifInfo): number[] {
	return [...new Set(info.tiles.flatMap((t) => t.scaleFactors))].sort((a, b) => a - b);
}

/** The tile size at a scale factor; a missing height means square tiles (IIIF Image API 3.0, from memory). */
function tileSpec(info: IiifInfo, scaleFactor: number): { tw: number; th: number } {
	const t = info.tiles.find((s) => s.scaleFactors.includes(scaleFactor));
	if (!t) throw new RangeError(`There are no tiles at scale factor ${scaleFactor} (available: ${allScaleFactors(info).join(', ')}).`);
	return { tw: t.width, th: t.height ?? t.width };
}

/**
 * The largest scale factor whose tiles are still at least as sharp as the screen needs. At scale
 * factor s one tile pixel covers s image pixels, so it is sharp enough while s × screenPxPerImagePx
 * ≤ 1. Pass device pixels (multiply by devicePixelRatio). Zoomed in beyond full resolution, the
 * smallest factor (normally 1) is the best there is.
 */
export function chooseScaleFactor(info: IiifInfo, screenPxPerImagePx: number): number {
	if (!(screenPxPerImagePx > 0)) throw new RangeError(`The zoom must be a positive number of screen pixels per image pixel, not ${screenPxPerImagePx}.`);
	const factors = allScaleFactors(info);
	let best = factors[0];
	if (best === undefined) throw new RangeError('The image description lists no scale factors.');
	// A little slack so that 0.5 zoom × factor 2 counts as exactly 1 despite floating point.
	for (const s of factors) if (s * screenPxPerImagePx <= 1 + 1e-9) best = s;
	return best;
}

/** The tile at column `col`, row `row` of the level at `scaleFactor`; RangeError outside the grid. */
export function tilePath(info: IiifInfo, scaleFactor: number, col: number, row: number): TileRef {
	const { tw, th } = tileSpec(info, scaleFactor);
	const spanX = tw * scaleFactor;
	const spanY = th * scaleFactor;
	const x = col * spanX;
	const y = row * spanY;
	if (!Number.isInteger(col) || !Number.isInteger(row) || col < 0 || row < 0 || x >= info.width || y >= info.height) {
		throw new RangeError(`There is no tile at column ${col}, row ${row} for scale factor ${scaleFactor}.`);
	}
	const w = Math.min(spanX, info.width - x);
	const h = Math.min(spanY, info.height - y);
	// Level dimensions are the image size divided by the factor, rounded up (libvips halves with
	// rounding up), so an edge tile holds the rest of the level: ceil(w / s) × ceil(h / s).
	const sizeW = Math.ceil(w / scaleFactor);
	const sizeH = Math.ceil(h / scaleFactor);
	const whole = x === 0 && y === 0 && w === info.width && h === info.height;
	const region = whole ? 'full' : `${x},${y},${w},${h}`;
	return { scaleFactor, region: { x, y, w, h }, sizeW, sizeH, path: `${region}/${sizeW},${sizeH}/0/default.${TILE_SUFFIX}` };
}

/**
 * The tiles that intersect `view` (clamped to the image) at the level chosen for the zoom, row by
 * row from the top left. An empty list when the view lies outside the image.
 */
export function tilesForView(info: IiifInfo, view: ImageRect, screenPxPerImagePx: number): TileRef[] {
	if ([view.x, view.y, view.w, view.h].some(Number.isNaN)) throw new RangeError('The view rectangle has a value that is not a number.');
	const s = chooseScaleFactor(info, screenPxPerImagePx);
	const { tw, th } = tileSpec(info, s);
	const x0 = Math.max(0, view.x);
	const y0 = Math.max(0, view.y);
	const x1 = Math.min(info.width, view.x + view.w);
	const y1 = Math.min(info.height, view.y + view.h);
	if (!(x1 > x0 && y1 > y0)) return [];
	const spanX = tw * s;
	const spanY = th * s;
	const c0 = Math.floor(x0 / spanX);
	const c1 = Math.ceil(x1 / spanX) - 1;
	const r0 = Math.floor(y0 / spanY);
	const r1 = Math.ceil(y1 / spanY) - 1;
	const out: TileRef[] = [];
	for (let row = r0; row <= r1; row++) for (let col = c0; col <= c1; col++) out.push(tilePath(info, s, col, row));
	return out;
}
