import { describe, expect, it } from 'vitest';
import { band, bandOf, score, worstBand } from '../../../src/lib/treatment/risk.ts';
import { ethanolFlashPointC, suggestHazards, type HazardRecord } from '../../../src/lib/treatment/hazards.ts';
import { templatePlan } from '../../../src/lib/treatment/plan.ts';

describe('the 5 × 5 risk matrix', () => {
	// Bands 1–4 / 5–9 / 10–16 / 20–25: common practice in workplace risk assessment, no published source.
	it('rates likelihood × severity and bands the product', () => {
		expect(score({ likelihood: 4, severity: 5 })).toBe(20);
		expect([1, 4, 5, 9, 10, 16, 20, 25].map(band)).toEqual(['low', 'low', 'medium', 'medium', 'high', 'high', 'very-high', 'very-high']);
		expect(bandOf({ likelihood: 3, severity: 3 })).toBe('medium');
		expect(worstBand([{ likelihood: 1, severity: 2 }, { likelihood: 4, severity: 4 }])).toBe('high');
		expect(worstBand([])).toBeNull();
	});
	it('refuses a rating outside 1–25', () => {
		expect(() => band(0)).toThrow(RangeError);
		expect(() => band(26)).toThrow(RangeError);
		expect(() => band(2.5)).toThrow(RangeError);
	});
});

describe('flash points of ethanol–water', () => {
	it('gives the published values at the table rows', () => {
		// TRADE.md [S41]: 50 % about 24 °C, 70 % about 21 °C, 96 % about 17 °C, pure ethanol 13 °C (closed cup).
		expect(ethanolFlashPointC(50)).toBe(24);
		expect(ethanolFlashPointC(70)).toBe(21);
		expect(ethanolFlashPointC(96)).toBe(17);
		expect(ethanolFlashPointC(100)).toBe(13);
	});
	it('interpolates between rows and gives none below the table', () => {
		// Linear interpolation between [S41]'s rows is our estimate: 80 % lies between 21 and 17 °C.
		const f = ethanolFlashPointC(80)!;
		expect(f).toBeLessThan(21);
		expect(f).toBeGreaterThan(17);
		expect(ethanolFlashPointC(40)).toBeNull();
		expect(ethanolFlashPointC(Number.NaN)).toBeNull();
	});
});

const jar = { shape: 'cylinder' as const, widthMm: 100, heightMm: 200 };
const record = (over: Partial<HazardRecord>): HazardRecord => ({
	preservativeKind: 'ethanol',
	sealType: 'silicone',
	hazards: [],
	jar,
	latestFluid: null,
	steps: templatePlan('silicone', () => Math.random().toString(36).slice(2)).map((s) => s.kind),
	...over,
});

describe('hazards suggested from the record', () => {
	it('suggests flammable spirit with its quantity and flash point', () => {
		const s = suggestHazards(record({ latestFluid: { realPercentVol: 70, formaldehyde: 'negative', levelMm: 150 } }));
		const spirit = s.find((h) => h.kind === 'flammable-spirit')!;
		// π × 50² × 150 mm³ = 1,178 mL → "1.2 L"; 70 % → about 21 °C [S41].
		expect(spirit.reason).toContain('About 1.2 L');
		expect(spirit.reason).toContain('about 21 °C');
		expect(s.map((h) => h.kind)).toEqual(['flammable-spirit', 'glass']);
	});
	it('counts a jar with no level as full', () => {
		const spirit = suggestHazards(record({})).find((h) => h.kind === 'flammable-spirit')!;
		// π × 50² × 200 = 1,571 mL.
		expect(spirit.reason).toContain('About 1.6 L');
		expect(spirit.reason).toContain('counted full');
	});
	it('suggests formaldehyde from formalin, a flag or a positive test', () => {
		expect(suggestHazards(record({ preservativeKind: 'formalin' })).map((h) => h.kind)).toContain('formaldehyde');
		expect(suggestHazards(record({ hazards: [{ flag: 'formaldehyde' }] })).map((h) => h.kind)).toContain('formaldehyde');
		expect(suggestHazards(record({ latestFluid: { realPercentVol: null, formaldehyde: 'positive', levelMm: null } })).map((h) => h.kind)).toContain('formaldehyde');
	});
	it('presumes an unknown fluid toxic and flammable', () => {
		const kinds = suggestHazards(record({ preservativeKind: 'unknown' })).map((h) => h.kind);
		expect(kinds).toContain('unknown-fluid');
		expect(kinds).not.toContain('flammable-spirit');
	});
	it('suggests the historic seal and heated tools for a pitch seal that is to be opened', () => {
		const kinds = suggestHazards(record({ sealType: 'pitch' })).map((h) => h.kind);
		expect(kinds).toEqual(['flammable-spirit', 'historic-seal', 'heated-tools', 'glass']);
		const noOpening = suggestHazards(record({ sealType: 'pitch', steps: ['photograph-before', 'record'] })).map((h) => h.kind);
		expect(noOpening).toEqual(['flammable-spirit', 'historic-seal']);
	});
	it('suggests the historic seal for a lead, arsenic or mercury flag', () => {
		const h = suggestHazards(record({ hazards: [{ flag: 'mercury' }] })).find((x) => x.kind === 'historic-seal')!;
		expect(h.reason).toContain('mercury');
	});
	it('puts the seal note that fits the jar in the starting plan', () => {
		const plan = templatePlan('pitch', () => 'x');
		expect(plan[0]!.kind).toBe('photograph-before');
		expect(plan.at(-1)!.kind).toBe('record');
		expect(plan.find((s) => s.kind === 'open-seal')!.notes).toMatch(/heat/);
	});
});
