import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { airspace } from '../../../src/lib/fluid/airspace.ts';
import { densityKgM3 } from '../../../src/lib/fluid/alcoholometry.ts';
import { airspaceFluid, airspaceVerdict, couldBeAtRisk, MAX_EXPANSION_PER_K, saferStores, type JarFill, type Store } from '../../../src/lib/overview/airspaceRisk.ts';

/**
 * Airspace at risk: the safe level is the tested airspace() (OIML R 22 densities via
 * src/lib/fluid/alcoholometry.ts); the draw-off arithmetic is checked by hand; the SQL pre-filter's
 * expansion bound is checked against the OIML formula over its whole range.
 */
const cylinder = { shape: 'cylinder', widthMm: 100, heightMm: 200 } as const;
const fill = (over: Partial<JarFill> = {}): JarFill => ({ jar: cylinder, material: 'soda-lime', percentVol: 70, levelMm: 199.5, fillTempC: 20, ...over });

describe('the verdict for one jar', () => {
	it('takes the safe level from airspace(): 70 % vol filled at 20 °C, warmest 25 °C', () => {
		// OIML R 22: 885.56 kg/m³ at 20 °C and 881.37 kg/m³ at 25 °C, so the fluid grows 885.56 / 881.37 − 1
		// = 0.475 %; soda-lime glass 25 × 10⁻⁶ /K × 5 K = 0.0125 %. Safe level = 200 × 1.000125 / 1.004751 = 199.08 mm.
		const v = airspaceVerdict(fill(), 25);
		expect(v.safeLevelMm).toBe(airspace({ jar: cylinder, material: 'soda-lime', percentVol: 70, fillTempC: 20, maxTempC: 25 }).maxFillLevelMm);
		expect(v.safeLevelMm).toBeCloseTo(199.08, 2);
	});
	it('draws off the excess: 199.5 − 199.08 = 0.42 mm, × π × 50² / 1000 = 7.854 mL per mm, = 3.31 mL', () => {
		const v = airspaceVerdict(fill(), 25);
		expect(v.atRisk).toBe(true);
		expect(v.drawOffMm).toBeCloseTo(0.4208, 3);
		expect(v.drawOffMl).toBeCloseTo(0.4208 * 7.853982, 2);
	});
	it('finds a jar safe at or below its safe level, and in a store no warmer than its filling', () => {
		expect(airspaceVerdict(fill({ levelMm: 199 }), 25)).toMatchObject({ atRisk: false, drawOffMm: 0, drawOffMl: 0 });
		expect(airspaceVerdict(fill({ levelMm: 200, fillTempC: 22 }), 21)).toMatchObject({ atRisk: false, safeLevelMm: 200 });
		expect(airspaceVerdict(fill({ levelMm: 200, fillTempC: 22 }), 22).atRisk).toBe(false);
	});
	it('needs more room for spirit than for formalin taken as water', () => {
		expect(airspaceVerdict(fill({ percentVol: 0 }), 25).safeLevelMm).toBeGreaterThan(airspaceVerdict(fill(), 25).safeLevelMm);
	});
});

describe('the strength a jar is assessed at', () => {
	it('is the measured real strength, 70 % vol when unmeasured, water for formalin', () => {
		expect(airspaceFluid('ethanol', 66.3)).toEqual({ percentVol: 66.3, basis: 'measured' });
		expect(airspaceFluid('industrial-spirit', null)).toEqual({ percentVol: 70, basis: 'assumed' });
		expect(airspaceFluid('formalin', null)).toEqual({ percentVol: 0, basis: 'water' });
	});
	it('is not given for fluids the ethanol–water formula does not describe', () => {
		for (const k of ['propan-2-ol', 'unknown', 'other'] as const) expect(airspaceFluid(k, 50)).toBeNull();
	});
});

describe('the pre-filter bound', () => {
	it('is just above the largest expansion per kelvin anywhere in the OIML R 22 range (pure ethanol near 40 °C, 1.141 × 10⁻³)', () => {
		let max = 0;
		for (let p = 0; p <= 100; p += 2) {
			for (let t = -20; t < 40; t += 1) max = Math.max(max, densityKgM3(p / 100, t) / densityKgM3(p / 100, t + 1) - 1);
		}
		expect(max).toBeGreaterThan(1.14e-3);
		expect(max).toBeLessThan(MAX_EXPANSION_PER_K);
	});
	it('never drops a jar that airspace() finds at risk', () => {
		fc.assert(
			fc.property(
				fc.record({
					shape: fc.constantFrom('cylinder', 'rectangular'),
					width: fc.integer({ min: 30, max: 300 }),
					height: fc.integer({ min: 50, max: 400 }),
					material: fc.constantFrom('soda-lime', 'borosilicate', 'acrylic'),
					percentVol: fc.double({ min: 0, max: 100, noNaN: true }),
					fillTempC: fc.double({ min: -20, max: 40, noNaN: true }),
					rise: fc.double({ min: 0, max: 30, noNaN: true }),
					headspace: fc.double({ min: 0, max: 0.05, noNaN: true }),
				}),
				(r) => {
					const maxTempC = Math.min(40, r.fillTempC + r.rise);
					const jar = { shape: r.shape, widthMm: r.width, depthMm: r.shape === 'cylinder' ? null : r.width / 2, heightMm: r.height };
					const f: JarFill = { jar, material: r.material, percentVol: r.percentVol, fillTempC: r.fillTempC, levelMm: r.height * (1 - r.headspace) };
					if (airspaceVerdict(f, maxTempC).atRisk) expect(couldBeAtRisk(r.height, f.levelMm, r.fillTempC, maxTempC)).toBe(true);
				},
			),
			{ numRuns: 400 },
		);
	});
});

describe('a cooler store for a jar at risk', () => {
	const store = (code: string, tempMaxC: number, roomMl: number | null): Store => ({ id: code, code, name: code, tempMaxC, roomMl });
	// 70 % vol filled at 17.5 °C to 0.5 mm under the lid of a 320 mm jar: at risk at 24 °C, safe at 19 °C.
	const f = fill({ jar: { shape: 'cylinder', widthMm: 100, heightMm: 320 }, levelMm: 319.5, fillTempC: 17.5 });

	it('offers only cooler stores where the jar is safe, warmest first', () => {
		expect(airspaceVerdict(f, 24).atRisk).toBe(true);
		const out = saferStores(f, 24, [store('COLD', 15, 50_000), store('WARM', 23, 50_000), store('MILD', 19, 50_000), store('HOT', 30, 50_000)], { fluidMl: 2500, flammable: true });
		expect(out.map((s) => s.code)).toEqual(['MILD', 'COLD']);
	});
	it('leaves out, for a flammable jar, stores without room under their limit or with no limit set', () => {
		const stores = [store('FULL', 18, 1000), store('UNSET', 18, null), store('ROOM', 16, 5000)];
		expect(saferStores(f, 24, stores, { fluidMl: 2500, flammable: true }).map((s) => s.code)).toEqual(['ROOM']);
		expect(saferStores(f, 24, stores, { fluidMl: 2500, flammable: false }).map((s) => s.code)).toEqual(['FULL', 'UNSET', 'ROOM']);
	});
	it('offers at most three', () => {
		const many = [14, 15, 16, 17, 18].map((t) => store(`S${t}`, t, 10_000));
		expect(saferStores(f, 24, many, { fluidMl: 1, flammable: true })).toHaveLength(3);
	});
});
