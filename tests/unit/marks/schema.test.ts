import { describe, expect, it } from 'vitest';
import { MarkLayerSchema, type Mark } from '../../../src/lib/marks/schema.ts';

/** The layer rules a single mark's schema cannot see. */
const t = '2026-12-02T10:00:00.000Z';
const who = { authorId: '00000000-0000-4000-8000-000000000001', createdAt: t, updatedAt: t };
const control = (id: string, n: number): Mark => ({ id, kind: 'control', n, at: [10, 10], ...who });
const layer = (...marks: Mark[]) => ({ schemaVersion: 1, marks, comments: [] });

describe('MarkLayerSchema', () => {
	it('refuses two control points with one number, and takes distinct ones', () => {
		expect(MarkLayerSchema.safeParse(layer(control('a', 1), control('b', 2))).success).toBe(true);
		const r = MarkLayerSchema.safeParse(layer(control('a', 1), control('b', 1)));
		expect(r.success).toBe(false);
		expect(JSON.stringify(r.error?.issues)).toMatch(/numbered 1/);
	});

	it('refuses a scale bar whose ends coincide, and a second scale bar', () => {
		const scale = (id: string, to: [number, number]): Mark => ({ id, kind: 'scale', from: [5, 5], to, lengthMm: 100, ...who });
		expect(JSON.stringify(MarkLayerSchema.safeParse(layer(scale('s', [5, 5]))).error?.issues)).toMatch(/two different ends/);
		expect(JSON.stringify(MarkLayerSchema.safeParse(layer(scale('s', [5, 50]), scale('t', [9, 50]))).error?.issues)).toMatch(/one scale bar/);
		expect(MarkLayerSchema.safeParse(layer(scale('s', [5, 50]))).success).toBe(true);
	});
});
