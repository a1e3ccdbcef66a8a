/**
 * Which boxes of one set overlap which of another, through a uniform grid, so comparing two layers
 * of n marks costs about n (plus the pairs found), not n²: each box is filed under the cells it
 * covers and only boxes sharing a cell are compared. The cell is the median box size, so a typical
 * mark covers a few cells.
 */
import type { Box } from './overlap.ts';

/** A box covering more cells than this is checked against every box instead (a mark over most of the photograph). */
const MAX_CELLS_PER_BOX = 256;
/** Cell indices are kept within ±2²⁰ so a numeric key cannot collide; beyond that cells merge, which stays correct. */
const LIMIT = 2 ** 20;

const touch = (a: Box, b: Box): boolean => a.minX <= b.maxX && b.minX <= a.maxX && a.minY <= b.maxY && b.minY <= a.maxY;

function cellSize(boxes: readonly Box[]): number {
	const sizes = boxes.map((b) => Math.max(b.maxX - b.minX, b.maxY - b.minY)).sort((p, q) => p - q);
	const median = sizes[Math.floor(sizes.length / 2)] ?? 1;
	return Math.max(1, median);
}

/**
 * Every pair [i, j] such that a[i] and b[j] overlap (touching counts), in increasing i then j.
 * Boxes must have finite coordinates.
 */
export function overlappingPairs(a: readonly Box[], b: readonly Box[]): [number, number][] {
	if (a.length === 0 || b.length === 0) return [];
	const cell = cellSize([...a, ...b]);
	const index = (v: number) => Math.max(-LIMIT, Math.min(LIMIT, Math.floor(v / cell)));
	const range = (box: Box) => ({ x0: index(box.minX), x1: index(box.maxX), y0: index(box.minY), y1: index(box.maxY) });
	const key = (ix: number, iy: number) => (ix + LIMIT) * (2 * LIMIT + 1) + (iy + LIMIT);
	const cells = new Map<number, number[]>();
	const oversized: number[] = [];
	a.forEach((box, i) => {
		const r = range(box);
		if ((r.x1 - r.x0 + 1) * (r.y1 - r.y0 + 1) > MAX_CELLS_PER_BOX) return void oversized.push(i);
		for (let ix = r.x0; ix <= r.x1; ix++) {
			for (let iy = r.y0; iy <= r.y1; iy++) {
				const k = key(ix, iy);
				const list = cells.get(k);
				if (list) list.push(i);
				else cells.set(k, [i]);
			}
		}
	});
	// seen[i] === j: a[i] already considered for b[j] (it shares several cells with it).
	const seen = new Int32Array(a.length).fill(-1);
	const pairs: [number, number][] = [];
	b.forEach((box, j) => {
		const found: number[] = [];
		const consider = (i: number) => {
			if (seen[i] === j) return;
			seen[i] = j;
			if (touch(a[i]!, box)) found.push(i);
		};
		oversized.forEach(consider);
		const r = range(box);
		if ((r.x1 - r.x0 + 1) * (r.y1 - r.y0 + 1) > MAX_CELLS_PER_BOX) a.forEach((_, i) => consider(i));
		else for (let ix = r.x0; ix <= r.x1; ix++) for (let iy = r.y0; iy <= r.y1; iy++) cells.get(key(ix, iy))?.forEach(consider);
		for (const i of found) pairs.push([i, j]);
	});
	return pairs.sort((p, q) => p[0] - q[0] || p[1] - q[1]);
}
