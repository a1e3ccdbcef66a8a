import type { View } from './geometry.ts';

/**
 * While a person pans or zooms, the condition map shows its marks from a bitmap drawn once at the
 * last settled view, moved and scaled with the photo, instead of stroking every mark on every frame
 * (bench/canvas.ts: stroking a thousand marks per frame ran at about a third of the frame rate of
 * none). When the view has been still for SETTLE_MS the marks are stroked again, sharp, so a still
 * picture is exactly what it was before. This module is the arithmetic: which part of the photo a
 * bitmap covers, and whether it can stand in for a given view.
 */
export const SNAPSHOT = {
	/** The bitmap covers the view and this fraction of the view's size beyond each edge, so a pan has room. */
	margin: 0.5,
	/** Beyond this many device pixels the margin shrinks (a 4K screen with margin would be 130 MP). */
	maxPixels: 16_000_000,
	/** Scaled past this factor, in or out, the bitmap is redrawn at the current zoom: blur or gaps would show. */
	maxRescale: 4,
	/** Still for this long, the view counts as settled and marks are stroked sharp again. */
	settleMs: 150,
	/** Labels and pins reach this far (screen px) beyond a mark's points; the bitmap keeps them. */
	padPx: 64,
} as const;

export interface Region {
	/** Photo pixels covered: left, top, width, height. */
	x: number;
	y: number;
	w: number;
	h: number;
	/** The zoom the bitmap was drawn at (screen px per photo px). */
	scale: number;
}

interface Box {
	w: number;
	h: number;
}

/** Marks live on the photo; drawing beyond it (plus the label reach) would only cost pixels. */
function photoBounds(photo: { width: number; height: number }, scale: number) {
	const pad = SNAPSHOT.padPx / scale;
	return { x0: -pad, y0: -pad, x1: photo.width + pad, y1: photo.height + pad };
}

/** The part of the photo a bitmap drawn at this view should cover, in photo pixels. */
export function snapshotRegion(view: View, box: Box, photo: { width: number; height: number }, dpr = 1): Region {
	const screenPx = box.w * box.h * dpr * dpr;
	// (1 + 2m)² · screen ≤ maxPixels: shrink the margin on very large screens, never below none.
	const m = Math.max(0, Math.min(SNAPSHOT.margin, (Math.sqrt(SNAPSHOT.maxPixels / Math.max(1, screenPx)) - 1) / 2));
	const vw = box.w / view.scale;
	const vh = box.h / view.scale;
	const b = photoBounds(photo, view.scale);
	const x0 = Math.max(b.x0, view.x - m * vw);
	const y0 = Math.max(b.y0, view.y - m * vh);
	const x1 = Math.min(b.x1, view.x + vw + m * vw);
	const y1 = Math.min(b.y1, view.y + vh + m * vh);
	return { x: x0, y: y0, w: Math.max(0, x1 - x0), h: Math.max(0, y1 - y0), scale: view.scale };
}

/**
 * Whether a bitmap of `region` can be shown for `view`: everything of the photo the view shows is
 * inside it, and it would be scaled by no more than maxRescale either way.
 */
export function snapshotServes(region: Region, view: View, box: Box, photo: { width: number; height: number }): boolean {
	const r = view.scale / region.scale;
	if (!(r <= SNAPSHOT.maxRescale && r >= 1 / SNAPSHOT.maxRescale)) return false;
	// Only the part of the view where marks can be needs covering; beyond the photo there are none.
	const b = photoBounds(photo, region.scale);
	const x0 = Math.max(b.x0, view.x);
	const y0 = Math.max(b.y0, view.y);
	const x1 = Math.min(b.x1, view.x + box.w / view.scale);
	const y1 = Math.min(b.y1, view.y + box.h / view.scale);
	if (x1 <= x0 || y1 <= y0) return true;
	const eps = 1e-6 * Math.max(photo.width, photo.height);
	return x0 >= region.x - eps && y0 >= region.y - eps && x1 <= region.x + region.w + eps && y1 <= region.y + region.h + eps;
}

/** Bitmap size in device pixels for a region: whole pixels, at least one. */
export function snapshotPixels(region: Region, dpr = 1): { w: number; h: number } {
	return { w: Math.max(1, Math.ceil(region.w * region.scale * dpr)), h: Math.max(1, Math.ceil(region.h * region.scale * dpr)) };
}

/** Whether two lists hold the same mark objects in the same order (marks are immutable in a layer). */
export function sameMarks<T>(a: readonly T[], b: readonly T[]): boolean {
	if (a === b) return true;
	if (a.length !== b.length) return false;
	for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
	return true;
}

export const sameView = (a: View, b: View): boolean => a.x === b.x && a.y === b.y && a.scale === b.scale;

export const sameRegion = (a: Region, b: Region): boolean => a.x === b.x && a.y === b.y && a.w === b.w && a.h === b.h && a.scale === b.scale;
