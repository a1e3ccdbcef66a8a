import { rescaleHomography, warpMesh } from '../../lib/compare/mesh.ts';
import type { Matrix3 } from '../../lib/compare/registration.ts';

/**
 * The later photograph's display copy redrawn in the earlier one's frame (at the earlier display
 * copy's size), through the registration, so both can be laid over each other: one drawImage per
 * mesh triangle, clipped to it (lib/compare/mesh.ts says why a mesh). Each clip is grown by half a
 * pixel so neighbouring triangles overlap and no hairline seam shows.
 */
export function warpToBefore(
	img: CanvasImageSource,
	after: { photoWidth: number; displayWidth: number; displayHeight: number },
	before: { photoWidth: number; displayWidth: number; displayHeight: number },
	transform: Matrix3,
	cells = 16,
): HTMLCanvasElement {
	const h = rescaleHomography(transform, after.displayWidth / after.photoWidth, before.displayWidth / before.photoWidth);
	const canvas = document.createElement('canvas');
	canvas.width = before.displayWidth;
	canvas.height = before.displayHeight;
	const c = canvas.getContext('2d')!;
	for (const t of warpMesh(h, after.displayWidth, after.displayHeight, cells)) {
		const [p, q, r] = t.dst;
		const cx = (p[0] + q[0] + r[0]) / 3;
		const cy = (p[1] + q[1] + r[1]) / 3;
		const grow = ([x, y]: readonly [number, number]): [number, number] => {
			const d = Math.hypot(x - cx, y - cy) || 1;
			return [x + ((x - cx) / d) * 0.5, y + ((y - cy) / d) * 0.5];
		};
		c.save();
		c.beginPath();
		c.moveTo(...grow(p));
		c.lineTo(...grow(q));
		c.lineTo(...grow(r));
		c.closePath();
		c.clip();
		c.setTransform(...t.affine);
		c.drawImage(img, 0, 0);
		c.restore();
	}
	return canvas;
}
