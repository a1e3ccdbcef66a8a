import { describe, expect, it } from 'vitest';
import { affineFromTriangles, applyAffine, meshError, rescaleHomography, warpMesh } from '../../../src/lib/compare/mesh.ts';
import { applyHomography, type Matrix3 } from '../../../src/lib/compare/registration.ts';

// Piecewise-affine warping (Heckbert 1989, "Fundamentals of Texture Mapping and Image Warping", §3):
// each triangle's affine map must hit its corners exactly, and the mesh must approach the homography
// as it gets finer (the error of linear interpolation falls with the square of the cell size).

// A camera turned a little and moved back: a mild perspective of the kind registration finds.
const H: Matrix3 = [
	[1.04, 0.03, -40],
	[-0.02, 1.01, 25],
	[2e-5, -1.5e-5, 1],
];

describe('the affine map of a triangle', () => {
	it('takes each corner to its image (worked by hand: a right triangle doubled and moved by (5, 7))', () => {
		// (0,0)→(5,7), (1,0)→(7,7), (0,1)→(5,9): a = d = 2, b = c = 0, e = 5, f = 7.
		expect(affineFromTriangles([[0, 0], [1, 0], [0, 1]], [[5, 7], [7, 7], [5, 9]])).toEqual([2, 0, 0, 2, 5, 7]);
	});

	it('hits the corners of any triangle under the homography', () => {
		const src = [[100, 200], [900, 250], [400, 1300]] as const;
		const dst = src.map((p) => applyHomography(H, p)) as unknown as [[number, number], [number, number], [number, number]];
		const m = affineFromTriangles(src, dst);
		src.forEach((p, i) => {
			const [x, y] = applyAffine(m, p);
			expect(x).toBeCloseTo(dst[i]![0], 9);
			expect(y).toBeCloseTo(dst[i]![1], 9);
		});
	});

	it('refuses a triangle with no area', () => {
		expect(() => affineFromTriangles([[0, 0], [1, 1], [2, 2]], [[0, 0], [1, 0], [0, 1]])).toThrow(RangeError);
	});
});

describe('the mesh', () => {
	it('covers the image with 2n² triangles whose corners sit on the homography', () => {
		const mesh = warpMesh(H, 2048, 1536, 8);
		expect(mesh).toHaveLength(2 * 8 * 8);
		for (const t of mesh) t.src.forEach((p, i) => expect(Math.hypot(...applyAffine(t.affine, p).map((v, k) => v - t.dst[i]![k]!) as [number, number])).toBeLessThan(1e-6));
	});

	it('is exact for an affine registration and converges on a perspective one', () => {
		const affine: Matrix3 = [[1.02, 0.01, 12], [-0.01, 0.99, -8], [0, 0, 1]];
		expect(meshError(affine, warpMesh(affine, 2048, 1536, 4))).toBeLessThan(1e-9);
		const e8 = meshError(H, warpMesh(H, 2048, 1536, 8));
		const e16 = meshError(H, warpMesh(H, 2048, 1536, 16));
		// Halving the cells divides the interpolation error by about 4.
		expect(e16).toBeLessThan(e8 / 3);
		// At 16 × 16 on a display copy the seams are far below a pixel.
		expect(e16).toBeLessThan(0.25);
	});

	it('restates a homography between display copies', () => {
		// Photo A shown at 0.25 (its display copy), photo B at 0.5: a point of A's copy, scaled up to A,
		// mapped by H and scaled down to B's copy, lands where the rescaled H sends it.
		const d = rescaleHomography(H, 0.25, 0.5);
		const p: [number, number] = [300, 200];
		const [x, y] = applyHomography(H, [p[0] / 0.25, p[1] / 0.25]);
		const [dx, dy] = applyHomography(d, p);
		expect(dx).toBeCloseTo(x * 0.5, 9);
		expect(dy).toBeCloseTo(y * 0.5, 9);
	});
});
