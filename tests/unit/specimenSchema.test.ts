import { describe, expect, it } from 'vitest';
import { SpecimenSchema } from '../../src/lib/specimen/schema.ts';

const base = {
	objectNumber: 'STC.1900.001',
	title: 'Test jar',
	preservativeKind: 'ethanol',
	containerShape: 'cylinder',
	innerWidthMm: 90,
	innerHeightMm: 180,
	containerMaterial: 'soda-lime',
	closureType: 'glass-lid',
	sealType: 'silicone',
} as const;

describe('specimen record validation', () => {
	it('accepts a cylinder with a diameter and a height', () => {
		expect(SpecimenSchema.safeParse(base).success).toBe(true);
	});
	it('asks an oval or rectangular jar for its second dimension, and keeps the minor axis ≤ the major', () => {
		expect(SpecimenSchema.safeParse({ ...base, containerShape: 'oval' }).success).toBe(false);
		expect(SpecimenSchema.safeParse({ ...base, containerShape: 'oval', innerDepthMm: 120 }).success).toBe(false);
		expect(SpecimenSchema.safeParse({ ...base, containerShape: 'oval', innerDepthMm: 60 }).success).toBe(true);
	});
	it('refuses unknown fields, odd object numbers, zero sizes and repeated hazards', () => {
		expect(SpecimenSchema.safeParse({ ...base, role: 'admin' }).success).toBe(false);
		expect(SpecimenSchema.safeParse({ ...base, objectNumber: ' <script>' }).success).toBe(false);
		expect(SpecimenSchema.safeParse({ ...base, innerWidthMm: 0 }).success).toBe(false);
		const twice = [{ flag: 'formaldehyde' }, { flag: 'formaldehyde' }];
		expect(SpecimenSchema.safeParse({ ...base, hazards: twice }).success).toBe(false);
	});
	it('refuses a size under 0.1 mm, which the record (kept to 0.1 mm, above 0) would store as 0', () => {
		for (const v of [0.04, 1e-7, 5e-324]) expect(SpecimenSchema.safeParse({ ...base, innerWidthMm: v }).success, String(v)).toBe(false);
		expect(SpecimenSchema.safeParse({ ...base, innerWidthMm: 0.1, specimenTopMm: 0.1 }).success).toBe(true);
		expect(SpecimenSchema.safeParse({ ...base, specimenTopMm: 0.01 }).success).toBe(false);
	});
});
