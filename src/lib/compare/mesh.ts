import { applyHomography, type Matrix3 } from './registration.ts';

/**
 * Canvas 2D can only draw an image through an affine transform, but a registration is a perspective
 * one. So the later photograph is cut into a grid of triangles and each is drawn through the affine
 * map that takes its three corners exactly where the homography takes them: piecewise affine, the
 * usual way of texture mapping without a GPU (Heckbert 1989, "Fundamentals of Texture Mapping and
 * Image Warping", §3). The finer the grid, the closer to the true warp (meshError measures it).
 */
export type XY = readonly [number, number];
export type Triangle = readonly [XY, XY, XY];
/** Canvas order: x' = a·x + c·y + e, y' = b·x + d·y + f. */
export type Affine = [a: number, b: number, c: number, d: number, e: number, f: number];

export interface MeshTriangle {
	src: Triangle;
	dst: Triangle;
	affine: Affine;
}

/** The affine map taking the three corners of `src` onto those of `dst`. */
export function affineFromTriangles(src: Triangle, dst: Triangle): Affine {
	const [[x0, y0], [x1, y1], [x2, y2]] = src;
	const det = (x1 - x0) * (y2 - y0) - (x2 - x0) * (y1 - y0);
	if (Math.abs(det) < 1e-12) throw new RangeError('A triangle of the mesh has no area.');
	const solve = (v0: number, v1: number, v2: number): [number, number, number] => {
		// v = p·x + q·y + r through the three corners (Cramer's rule on the differences).
		const p = ((v1 - v0) * (y2 - y0) - (v2 - v0) * (y1 - y0)) / det;
		const q = ((x1 - x0) * (v2 - v0) - (x2 - x0) * (v1 - v0)) / det;
		return [p, q, v0 - p * x0 - q * y0];
	};
	const [a, c, e] = solve(dst[0][0], dst[1][0], dst[2][0]);
	const [b, d, f] = solve(dst[0][1], dst[1][1], dst[2][1]);
	return [a, b, c, d, e, f];
}

export const applyAffine = (m: Affine, [x, y]: XY): [number, number] => [m[0] * x + m[2] * y + m[4], m[1] * x + m[3] * y + m[5]];

/** A width × height image cut into n × n cells of two triangles, each with its place under `h`. */
export function warpMesh(h: Matrix3, width: number, height: number, n = 16): MeshTriangle[] {
	if (!(width > 0 && height > 0)) throw new RangeError('The image needs a size.');
	if (!Number.isInteger(n) || n < 1 || n > 256) throw new RangeError('The mesh has 1 to 256 cells a side.');
	const grid: XY[][] = [];
	const mapped: XY[][] = [];
	for (let j = 0; j <= n; j++) {
		grid.push([]);
		mapped.push([]);
		for (let i = 0; i <= n; i++) {
			const p: XY = [(width * i) / n, (height * j) / n];
			grid[j]!.push(p);
			mapped[j]!.push(applyHomography(h, p));
		}
	}
	const out: MeshTriangle[] = [];
	for (let j = 0; j < n; j++) {
		for (let i = 0; i < n; i++) {
			const s = [grid[j]![i]!, grid[j]![i + 1]!, grid[j + 1]![i + 1]!, grid[j + 1]![i]!] as const;
			const d = [mapped[j]![i]!, mapped[j]![i + 1]!, mapped[j + 1]![i + 1]!, mapped[j + 1]![i]!] as const;
			for (const [k0, k1, k2] of [[0, 1, 2], [0, 2, 3]] as const) {
				const src: Triangle = [s[k0], s[k1], s[k2]];
				const dst: Triangle = [d[k0], d[k1], d[k2]];
				out.push({ src, dst, affine: affineFromTriangles(src, dst) });
			}
		}
	}
	return out;
}

/** The largest distance (px of the destination) between the mesh and the true warp, at each triangle's centroid and edge midpoints. */
export function meshError(h: Matrix3, mesh: readonly MeshTriangle[]): number {
	let worst = 0;
	for (const t of mesh) {
		const [p, q, r] = t.src;
		const probes: XY[] = [
			[(p[0] + q[0] + r[0]) / 3, (p[1] + q[1] + r[1]) / 3],
			[(p[0] + q[0]) / 2, (p[1] + q[1]) / 2],
			[(q[0] + r[0]) / 2, (q[1] + r[1]) / 2],
			[(r[0] + p[0]) / 2, (r[1] + p[1]) / 2],
		];
		for (const s of probes) {
			const [ax, ay] = applyAffine(t.affine, s);
			const [hx, hy] = applyHomography(h, s);
			worst = Math.max(worst, Math.hypot(ax - hx, ay - hy));
		}
	}
	return worst;
}

/**
 * A homography between full-resolution photos, restated between smaller copies of them (the display
 * copies the compare views draw): S_to · H · S_from⁻¹, with each S a uniform scale (copy px per photo px).
 */
export function rescaleHomography(h: Matrix3, fromScale: number, toScale: number): Matrix3 {
	const k = toScale / fromScale;
	return [
		[h[0]![0]! * k, h[0]![1]! * k, h[0]![2]! * toScale],
		[h[1]![0]! * k, h[1]![1]! * k, h[1]![2]! * toScale],
		[h[2]![0]! / fromScale, h[2]![1]! / fromScale, h[2]![2]!],
	];
}
