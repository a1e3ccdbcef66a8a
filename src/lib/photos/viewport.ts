import type { View } from '../marks/geometry.ts';
import type { ImageRect } from './iiifTiles.ts';

/**
 * The view arithmetic of every zoomable photo (the deep-zoom view and the condition map): a view
 * is the zoom (screen px per photo px) and the photo pixel at the screen's top-left corner.
 */
export type { View };

export interface Size {
	w: number;
	h: number;
}

/** The whole photo in the box, centred. */
export function fitView(box: Size, photo: { width: number; height: number }): View {
	const scale = Math.min(box.w / photo.width, box.h / photo.height);
	return { scale, x: -(box.w / scale - photo.width) / 2, y: -(box.h / scale - photo.height) / 2 };
}

/** Zoom by `factor` keeping the photo point under screen point (sx, sy) where it is; scale kept within [min, max]. */
export function zoomAbout(v: View, factor: number, sx: number, sy: number, min: number, max: number): View {
	const scale = Math.min(max, Math.max(min, v.scale * factor));
	return { scale, x: v.x + sx / v.scale - sx / scale, y: v.y + sy / v.scale - sy / scale };
}

/** Move by a distance in screen pixels. */
export const panBy = (v: View, dx: number, dy: number): View => ({ ...v, x: v.x + dx / v.scale, y: v.y + dy / v.scale });

/** The part of the photo the box shows, in photo pixels (what tilesForView asks for). */
export const visibleRect = (v: View, box: Size): ImageRect => ({ x: v.x, y: v.y, w: box.w / v.scale, h: box.h / v.scale });
