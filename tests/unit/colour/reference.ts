import fs from 'node:fs';
import path from 'node:path';
import { expect } from 'vitest';

/**
 * The project's copy of the published colour references (shared/reference/colour.json), beside the
 * checkout; null where it is not there, so the tests that compare with it are skipped, not failed.
 */
const file = path.resolve('..', 'shared', 'reference', 'colour.json');

export const colourReference: ColourReference | null = fs.existsSync(file) ? JSON.parse(fs.readFileSync(file, 'utf8')) : null;

export interface ColourReference {
	sRGB: { matrix_sRGB_linear_to_XYZ: number[][]; white_D65_XYZ: number[]; transfer_function: { test_vector: { L: number; V: number } } };
	ciede2000: { pairs: { pair: number; lab1: [number, number, number]; lab2: [number, number, number]; dE00: number }[] };
	yellowness_astm_e313: {
		coefficients: Record<string, { C_X: number; C_Z: number }>;
		worked_example: { XYZ: [number, number, number]; YI_D65_2deg: number };
	};
}

/** Within ±tol, with a message that says what was compared. */
export const near = (actual: number, expected: number, tol: number, what: string): void =>
	expect(Math.abs(actual - expected), `${what}: got ${actual}, expected ${expected} ± ${tol}`).toBeLessThanOrEqual(tol);

/** Each of three components within ±tol. */
export function nearTriple(actual: readonly number[], expected: readonly number[], tol: number, what: string): void {
	const names = ['first', 'second', 'third'];
	expected.forEach((v, i) => near(actual[i]!, v, tol, `${what}, ${names[i]} value`));
}
