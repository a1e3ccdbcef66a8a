/**
 * Limits on what an upload may be, shared by the uploader (Uppy's restrictions) and the server (tus
 * and the ingest job), so the browser refuses early what the server would refuse anyway.
 */

/** 1 GiB: a 60-megapixel 16-bit TIFF is about 360 MB; nothing a camera writes comes near this. */
export const MAX_UPLOAD_BYTES = 1024 * 1024 * 1024;

/**
 * 200 megapixels. The largest camera sensors in use write about 100 MP (and stitched panoramas of a
 * jar are rare); a file declaring more is refused from its header, before any pixel is decoded,
 * because decoding it would take several gigabytes of memory (a "pixel flood").
 */
export const MAX_PIXELS = 200_000_000;

/** Longest edge of the display copy (about screen size on a large monitor); thumbnails are small. */
export const DISPLAY_LONG_EDGE = 2048;
export const THUMBNAIL_LONG_EDGE = 400;
/** IIIF tile size; 512 keeps the request count low for a 60 MP photo while each tile stays small. */
export const TILE_SIZE = 512;

/** How many files one person may drop in one go; more is almost certainly a wrong folder. */
export const MAX_FILES_PER_BATCH = 500;

export const ACCEPTED_TYPES_TEXT = 'JPEG, PNG, TIFF or WebP';

export function formatBytes(n: number): string {
	if (n < 1024) return `${n} B`;
	const units = ['KB', 'MB', 'GB'];
	let v = n / 1024;
	let i = 0;
	while (v >= 1024 && i < units.length - 1) {
		v /= 1024;
		i++;
	}
	return `${v.toFixed(v >= 100 ? 0 : 1)} ${units[i]}`;
}
