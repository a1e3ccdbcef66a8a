import fsp from 'node:fs/promises';
import path from 'node:path';
import sharp, { type Metadata, type OutputInfo } from 'sharp';
import exifr from 'exifr';
import { checkEnd, sniffHead, type RasterKind } from '../../photos/sniff.ts';
import { DISPLAY_LONG_EDGE, MAX_PIXELS, THUMBNAIL_LONG_EDGE, TILE_SIZE } from '../../photos/limits.ts';
import { summariseExif, type StoredExif } from '../../photos/exif.ts';
import { readSlice, removeQuietly } from './storage.ts';
import { isOutOfSpace } from './diskFull.ts';

/**
 * The image work of an upload, with no database in it (so the benchmark runs exactly this):
 * inspect the bytes and the header before any pixel is decoded, then decode once and fan out the
 * thumbnail, the display copy and the IIIF tile pyramid from the one decoded raster.
 */

export type Refusal = { code: string; reason: string };
export type Inspection =
	| { ok: true; kind: RasterKind; mime: string; width: number; height: number; orientation: number | null; pages: number }
	| { ok: false; refusal: Refusal };

/** Decoding and encoding stop after this long; a file that takes longer is refused, not waited on. */
const SHARP_TIMEOUT_S = 180;

const DECODABLE: ReadonlySet<RasterKind> = new Set(['jpeg', 'png', 'tiff', 'webp']);

/** Options for every sharp instance that reads an upload: the pixel limit, and fail on truncation. */
export const inputOptions = { limitInputPixels: MAX_PIXELS, failOn: 'truncated', sequentialRead: true } as const;

/** Threads libvips may use per operation; set once per process by the worker. */
export function configureSharp(threads: number): void {
	sharp.concurrency(threads);
	// Uploads are read once; libvips's operation cache would only hold memory.
	sharp.cache(false);
}

const refuse = (code: string, reason: string): Inspection => ({ ok: false, refusal: { code, reason } });

/** Bytes first, then the header: nothing here decodes pixels. */
export async function inspect(file: string): Promise<Inspection> {
	const size = (await fsp.stat(file)).size;
	const head = await readSlice(file, 0, 4096);
	const sniff = sniffHead(head, size);
	if (!sniff.ok) return refuse(sniff.code, sniff.reason);
	if (sniff.kind === 'heic') return refuse('heic', 'This is a HEIC photo. This server cannot decode HEIC; export it from the camera or phone as JPEG or TIFF and upload that.');
	if (!DECODABLE.has(sniff.kind)) return refuse('not-accepted', `This is ${sniff.kind.toUpperCase()} image data, which is not accepted for record photographs; upload JPEG, PNG, TIFF or WebP.`);
	const tail = await readSlice(file, Math.max(0, size - 4096), Math.min(size, 4096));
	const end = checkEnd(sniff.kind, head, tail, size);
	if (!end.ok) return refuse(end.code, end.reason);
	let meta: Metadata;
	try {
		// limitInputPixels: false here so that the size can be reported; the check follows at once.
		meta = await sharp(file, { ...inputOptions, limitInputPixels: false }).metadata();
	} catch (err) {
		return refuse('unreadable', `The image header cannot be read (${shortError(err)}); the file is damaged or not what it claims to be.`);
	}
	// Older sharp reported some JPEGs as 'jpg'; kept so a downgrade cannot turn every JPEG into a mismatch.
	const fmt = String(meta.format) === 'jpg' ? 'jpeg' : meta.format;
	if (fmt !== sniff.kind) return refuse('mismatch', `The bytes start like ${sniff.kind.toUpperCase()} but decode as ${String(meta.format).toUpperCase()}; the file is not accepted.`);
	const width = meta.width ?? 0;
	const height = meta.height ?? 0;
	if (!(width > 0 && height > 0)) return refuse('unreadable', 'The image header states no pixel size.');
	if (width * height > MAX_PIXELS) {
		return refuse(
			'too-many-pixels',
			`The image declares ${width.toLocaleString('en-GB')} × ${height.toLocaleString('en-GB')} pixels (${Math.round((width * height) / 1e6).toLocaleString('en-GB')} megapixels); the limit is ${MAX_PIXELS / 1e6} megapixels.`,
		);
	}
	const orientation = meta.orientation ?? null;
	const swap = orientation !== null && orientation >= 5 && orientation <= 8;
	return { ok: true, kind: sniff.kind, mime: sniff.mime, width: swap ? height : width, height: swap ? width : height, orientation, pages: meta.pages ?? 1 };
}

export async function readExif(file: string): Promise<StoredExif> {
	try {
		const tags = await exifr.parse(file, { tiff: true, exif: true, gps: true, ifd1: false, interop: false, xmp: false, icc: false, iptc: false, reviveValues: false, translateValues: false, mergeOutput: true });
		return summariseExif(tags as Record<string, unknown> | undefined);
	} catch {
		// A photo without readable EXIF is still a photo (scans, exports); its EXIF is simply empty.
		return summariseExif(null);
	}
}

export interface DerivativeFile {
	kind: 'thumbnail' | 'display' | 'tiles';
	/** Relative to the set folder. */
	path: string;
	mediaType: string;
	width: number;
	height: number;
	byteSize: number;
}

/**
 * Writes the derivative set into `setDir` (which must not exist yet): decode the master once,
 * upright and in sRGB, then resize and tile from that raster in parallel. Output carries no
 * metadata at all (sharp drops EXIF, GPS and XMP unless asked to keep them).
 */
export async function makeDerivatives(master: string, setDir: string): Promise<DerivativeFile[]> {
	await fsp.mkdir(setDir, { recursive: false });
	let decoded: { data: Buffer; info: OutputInfo };
	try {
		decoded = await sharp(master, { ...inputOptions, pages: 1 })
			.timeout({ seconds: SHARP_TIMEOUT_S })
			.autoOrient()
			.flatten({ background: '#ffffff' })
			.toColourspace('srgb')
			.raw({ depth: 'uchar' })
			.toBuffer({ resolveWithObject: true });
	} catch (err) {
		await removeQuietly(setDir);
		// Whatever stops the decoder is the file's doing (libvips' words vary, down to "Unknown error"
		// for a damaged PNG header: TESTPLAN B3 found it), unless the machine ran short.
		throw isMachineFault(err) ? err : new UndecodableImage(err);
	}
	try {
		const { width, height, channels } = decoded.info;
		const from = () => sharp(decoded.data, { raw: { width, height, channels }, limitInputPixels: MAX_PIXELS }).timeout({ seconds: SHARP_TIMEOUT_S });
		const resized = async (kind: 'thumbnail' | 'display', edge: number, quality: number): Promise<DerivativeFile> => {
			const file = `${kind}.jpg`;
			const info = await from()
				.resize(edge, edge, { fit: 'inside', withoutEnlargement: true })
				.jpeg({ quality, mozjpeg: false, chromaSubsampling: kind === 'display' ? '4:4:4' : '4:2:0' })
				.toFile(path.join(setDir, file));
			return { kind, path: file, mediaType: 'image/jpeg', width: info.width, height: info.height, byteSize: info.size };
		};
		const tiles = async (): Promise<DerivativeFile> => {
			// The id written into info.json is replaced when it is served (it depends on the address used).
			await from().jpeg({ quality: 84 }).tile({ layout: 'iiif3', size: TILE_SIZE, id: 'meniscus:' }).toFile(path.join(setDir, 'tiles'));
			// libvips writes a properties file beside the pyramid; nothing needs it.
			await removeQuietly(path.join(setDir, 'vips-properties.xml'));
			const info = await fsp.stat(path.join(setDir, 'tiles', 'info.json'));
			return { kind: 'tiles', path: 'tiles/info.json', mediaType: 'application/ld+json', width, height, byteSize: info.size };
		};
		// Every write is let finish before a failure is acted on, so none adds files after the clean-up.
		const made = await Promise.allSettled([resized('thumbnail', THUMBNAIL_LONG_EDGE, 80), resized('display', DISPLAY_LONG_EDGE, 86), tiles()]);
		const failed = made.find((r) => r.status === 'rejected');
		if (failed) throw failed.reason;
		return made.map((r) => (r as PromiseFulfilledResult<DerivativeFile>).value);
	} catch (err) {
		// Half a set is no set: nothing of it stays.
		await removeQuietly(setDir);
		throw new DerivativeWriteError(err);
	}
}

/**
 * Making a derivative from pixels already decoded failed: a fault of the machine (a full disk,
 * an I/O error), never of the photo, whatever words libvips uses ("VipsJpeg: unable to write").
 * The job fails and is retried; the upload is never refused for it (TESTPLAN F7).
 */
export class DerivativeWriteError extends Error {
	override name = 'DerivativeWriteError';
	constructor(cause: unknown) {
		const detail = String((cause as Error)?.message ?? cause).replace(/\s*\n\s*/g, '; ');
		super(`${isOutOfSpace(cause) ? 'Out of disk space while writing' : 'Could not write'} the derivatives (${detail.slice(0, 400)}).`, { cause });
	}
}

/**
 * The pixels of a derivative we wrote (a display copy: upright, sRGB, at most DISPLAY_LONG_EDGE),
 * as 8-bit RGB rows, for measuring colours in it. Three channels whatever the file holds.
 */
export async function readRgb(file: string): Promise<{ data: Buffer; width: number; height: number; channels: 3 }> {
	const { data, info } = await sharp(file, { limitInputPixels: MAX_PIXELS, failOn: 'truncated' })
		.timeout({ seconds: SHARP_TIMEOUT_S })
		.toColourspace('srgb')
		.removeAlpha()
		.raw({ depth: 'uchar' })
		.toBuffer({ resolveWithObject: true });
	if (info.channels !== 3) throw new Error(`expected 3 channels from ${file}, got ${info.channels}`);
	return { data, width: info.width, height: info.height, channels: 3 };
}

/** The decoder could not read the photo: the file's fault, refused rather than retried. */
export class UndecodableImage extends Error {
	constructor(readonly cause: unknown) {
		super(String((cause as Error)?.message ?? cause));
	}
}

const MACHINE_CODES = new Set(['ENOMEM', 'EMFILE', 'ENFILE', 'EIO', 'EACCES', 'EPERM', 'EROFS', 'EBUSY']);
const MACHINE_WORDS = /out of memory|cannot allocate memory|too many open files|input\/output error|permission denied|read-only file system/i;

/** The machine had a problem (disk space, memory, files, permissions): retry later, never blame the photo. */
export function isMachineFault(err: unknown): boolean {
	if (isOutOfSpace(err)) return true;
	const code = (err as NodeJS.ErrnoException | null)?.code;
	return (typeof code === 'string' && MACHINE_CODES.has(code)) || MACHINE_WORDS.test(String((err as Error | null)?.message ?? err));
}

/** Errors from libvips that mean "this file is bad", as opposed to "the machine had a problem". */
export function isDecodeError(err: unknown): boolean {
	if (err instanceof UndecodableImage) return true;
	if (err instanceof DerivativeWriteError || isMachineFault(err)) return false;
	const m = String((err as Error)?.message ?? err);
	return /VipsJpeg|Premature end|truncated|corrupt|not a known|unsupported image format|Input file has corrupt|bad seek|Input image exceeds pixel limit|read error|invalid|VipsForeignLoad|timeout/i.test(m);
}

/**
 * The first line of a library's error, for a refusal the uploader reads: libvips names the file it
 * was reading, so server paths are replaced by "the file" (ASVS 5.0 16.5.1; TESTPLAN B3 found them).
 */
export function shortError(err: unknown): string {
	const line = String((err as Error)?.message ?? err).split('\n')[0] ?? '';
	return line.replace(/"?(?:\/[^\s:"']+)+"?/g, 'the file').slice(0, 200);
}

/** A display copy with an SVG of the same size laid over it, as a JPEG for a printed report. */
export async function compositeSvg(file: string, svg: string): Promise<Buffer> {
	return sharp(file, inputOptions)
		.timeout({ seconds: SHARP_TIMEOUT_S })
		.composite([{ input: Buffer.from(svg), top: 0, left: 0 }])
		.jpeg({ quality: 85 })
		.toBuffer();
}
