import type { Mark } from '../../lib/marks/schema.ts';
import { CASING, HALO } from '../../lib/marks/palette.ts';
import { SNAPSHOT, snapshotPixels, type Region } from '../../lib/marks/snapshot.ts';
import { geometry, styleOf } from './markStyle.ts';

/**
 * A whole mark layer drawn with the plain canvas 2D API, in photo pixels inside whatever transform
 * the context has (the Konva layer's on screen, a bitmap's in the worker). Looks like MarkShape: a
 * black casing under every stroke, a white halo under severe ones, the code label beside each mark.
 * Each mark is stroked on its own: batching strokes of one style into one path measured slower
 * (bench/canvas.ts).
 */
export type Ctx = CanvasRenderingContext2D | OffscreenCanvasRenderingContext2D;

function trace(c: Ctx, points: number[], closed: boolean) {
	c.beginPath();
	c.moveTo(points[0]!, points[1]!);
	for (let i = 2; i < points.length; i += 2) c.lineTo(points[i]!, points[i + 1]!);
	if (closed) c.closePath();
}

function drawMark(c: Ctx, m: Mark, k: number) {
	const s = styleOf(m);
	const g = geometry(m);
	c.setLineDash(s.dash.map((d) => d * k));
	if (g.pin) {
		c.beginPath();
		c.arc(g.pin[0], g.pin[1], 7 * k, 0, Math.PI * 2);
		c.fillStyle = s.colour;
		c.fill();
		c.lineWidth = 2 * k;
		c.strokeStyle = CASING.colour;
		c.stroke();
	} else {
		const passes: [string, number][] = [];
		if (s.halo) passes.push([HALO.colour, s.width + HALO.width]);
		passes.push([CASING.colour, s.width + CASING.width], [s.colour, s.width]);
		for (const [colour, width] of passes) {
			trace(c, g.points, g.closed);
			c.strokeStyle = colour;
			c.lineWidth = width * k;
			c.stroke();
		}
		if (m.kind === 'scale') {
			c.setLineDash([]);
			for (const [x, y] of [m.from, m.to]) {
				trace(c, [x, y - 10 * k, x, y + 10 * k], false);
				c.strokeStyle = s.colour;
				c.lineWidth = s.width * k;
				c.stroke();
			}
		}
	}
	c.setLineDash([]);
	c.font = `bold ${13 * k}px sans-serif`;
	c.lineWidth = 3 * k;
	c.strokeStyle = CASING.colour;
	c.fillStyle = s.colour;
	const x = g.anchor[0] + 9 * k;
	const y = g.anchor[1] - 9 * k + 13 * k;
	c.strokeText(s.code, x, y);
	c.fillText(s.code, x, y);
}

const bounds = new WeakMap<Mark, [number, number, number, number]>();
function boundsOf(m: Mark): [number, number, number, number] {
	let b = bounds.get(m);
	if (!b) {
		const g = geometry(m);
		const pts = g.pin ? [...g.pin, ...g.anchor] : [...g.points, ...g.anchor];
		let x0 = Infinity;
		let y0 = Infinity;
		let x1 = -Infinity;
		let y1 = -Infinity;
		for (let i = 0; i < pts.length; i += 2) {
			x0 = Math.min(x0, pts[i]!);
			x1 = Math.max(x1, pts[i]!);
			y0 = Math.min(y0, pts[i + 1]!);
			y1 = Math.max(y1, pts[i + 1]!);
		}
		b = [x0, y0, x1, y1];
		bounds.set(m, b);
	}
	return b;
}

/** Every mark at this zoom that can show in `clip` (photo px); marks wholly outside it are skipped. */
export function drawAll(c: Ctx, marks: readonly Mark[], zoom: number, clip: { x: number; y: number; w: number; h: number }) {
	// Labels, pins and strokes reach beyond a mark's points by a fixed amount on screen.
	const pad = SNAPSHOT.padPx / zoom;
	const x0 = clip.x - pad;
	const y0 = clip.y - pad;
	const x1 = clip.x + clip.w + pad;
	const y1 = clip.y + clip.h + pad;
	c.save();
	c.lineCap = 'round';
	c.lineJoin = 'round';
	for (const m of marks) {
		const b = boundsOf(m);
		if (b[2] < x0 || b[0] > x1 || b[3] < y0 || b[1] > y1) continue;
		drawMark(c, m, 1 / zoom);
	}
	c.restore();
}

/**
 * The marks of `region` drawn into a bitmap at its zoom. An ImageBitmap is plain pixels: blitting a
 * canvas instead cost about ten times as much per frame on Chromium's CPU rasteriser, which replays
 * the canvas's recorded drawing, so a DOM canvas is only the fallback where OffscreenCanvas is missing.
 */
export function drawSnapshot(marks: readonly Mark[], region: Region, dpr: number): ImageBitmap | HTMLCanvasElement {
	const px = snapshotPixels(region, dpr);
	const offscreen = typeof OffscreenCanvas === 'function' ? new OffscreenCanvas(px.w, px.h) : null;
	const canvas = offscreen ?? Object.assign(document.createElement('canvas'), { width: px.w, height: px.h });
	const c = canvas.getContext('2d') as Ctx;
	const k = region.scale * dpr;
	c.setTransform(k, 0, 0, k, -region.x * k, -region.y * k);
	drawAll(c, marks, region.scale, region);
	return offscreen ? offscreen.transferToImageBitmap() : (canvas as HTMLCanvasElement);
}
