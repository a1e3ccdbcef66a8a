import { inverse, Matrix } from 'ml-matrix';
import type { Triple } from './triple.ts';

/** A 3 × 3 matrix as three rows. */
export type Matrix3 = readonly [Triple, Triple, Triple];

/** m · v, written out: three dot products need no library object built around them. */
export function apply3(m: Matrix3, v: Triple): [number, number, number] {
	const [r0, r1, r2] = m;
	return [
		r0[0] * v[0] + r0[1] * v[1] + r0[2] * v[2],
		r1[0] * v[0] + r1[1] * v[1] + r1[2] * v[2],
		r2[0] * v[0] + r2[1] * v[1] + r2[2] * v[2],
	];
}

const row = (r: number[] | undefined): Triple => [r?.[0] ?? NaN, r?.[1] ?? NaN, r?.[2] ?? NaN];
const toMatrix3 = (m: Matrix): Matrix3 => {
	const rows = m.to2DArray();
	return [row(rows[0]), row(rows[1]), row(rows[2])];
};

/** The inverse, by ml-matrix (LU decomposition) rather than a hand-written cofactor formula. */
export const invert3 = (m: Matrix3): Matrix3 => toMatrix3(inverse(new Matrix(m.map((r) => [...r]))));

/** The product a · b · c … in that order. */
export function multiply3(...ms: Matrix3[]): Matrix3 {
	const [first, ...rest] = ms.map((m) => new Matrix(m.map((r) => [...r])));
	if (!first) throw new RangeError('multiply3 needs at least one matrix.');
	return toMatrix3(rest.reduce((acc, m) => acc.mmul(m), first));
}
