import { describe, expect, it } from 'vitest';
import { fluidLevelChange, fluidLevelChangeFromReadings, levelChange, levelHeight } from '../../../src/lib/compare/fluid.ts';
import { layerOf, stamp } from './synthetic.ts';

type P = [number, number];
const level = (id: string, which: string, from: P, to: P) => ({ ...stamp, id, kind: 'level', level: which, from, to });
const scaleBar = (px: number, mm: number) => ({ ...stamp, id: 'scale', kind: 'scale', from: [0, 20], to: [px, 20], lengthMm: mm });

/** Rotates a point by `deg` about (cx, cy): a photograph taken with the camera tilted. */
const rotate = ([x, y]: P, deg: number, [cx, cy]: P = [300, 600]): P => {
	const t = (deg * Math.PI) / 180;
	return [cx + (x - cx) * Math.cos(t) - (y - cy) * Math.sin(t), cy + (x - cx) * Math.sin(t) + (y - cy) * Math.cos(t)];
};

describe('levelHeight', () => {
	it('measures from the fluid line’s middle to the inner base, in px and with the scale in mm', () => {
		// Base at y = 900, fluid line at y = 300: 600 px; the scale bar is 100 mm over 500 px, 0.2 mm/px: 120 mm.
		const layer = layerOf([level('f', 'fluid-line', [100, 300], [500, 300]), level('b', 'inner-base', [80, 900], [520, 900]), scaleBar(500, 100)]);
		expect(levelHeight(layer)).toEqual({ heightPx: 600, heightMm: 120, reason: null });
	});

	it('measures at right angles to the base line, so a tilted photograph gives the same height', () => {
		// Distances are unchanged by rotation (a rigid motion); the straight-down distance is not:
		// at 10° it would be 600 / cos 10° ≈ 609 px for the middle of a level line.
		const f: P[] = [[100, 300], [500, 300]];
		const b: P[] = [[80, 900], [520, 900]];
		const tilted = layerOf([level('f', 'fluid-line', rotate(f[0]!, 10), rotate(f[1]!, 10)), level('b', 'inner-base', rotate(b[0]!, 10), rotate(b[1]!, 10))]);
		expect(levelHeight(tilted, 0.2).heightPx).toBeCloseTo(600, 9);
		expect(levelHeight(tilted, 0.2).heightMm).toBeCloseTo(120, 9);
		// The base drawn right to left is the same line.
		const reversed = layerOf([level('f', 'fluid-line', [100, 300], [500, 300]), level('b', 'inner-base', [520, 900], [80, 900])]);
		expect(levelHeight(reversed, 0.5).heightMm).toBeCloseTo(300, 12);
	});

	it('says why there is no height: a missing line, two of one, no scale, the fluid below the base', () => {
		const f = level('f', 'fluid-line', [100, 300], [500, 300]);
		const b = level('b', 'inner-base', [80, 900], [520, 900]);
		expect(levelHeight(layerOf([b]))).toMatchObject({ heightMm: null, reason: 'No fluid line is marked on this photograph.' });
		expect(levelHeight(layerOf([f]))).toMatchObject({ heightMm: null, reason: 'No inner-base line is marked on this photograph.' });
		expect(levelHeight(layerOf([f, { ...f, id: 'f2' }, b])).reason).toMatch(/2 fluid lines are marked/);
		expect(levelHeight(layerOf([f, b]))).toEqual({ heightPx: 600, heightMm: null, reason: 'This photograph has no scale bar, so the level cannot be given in mm.' });
		expect(levelHeight(layerOf([level('f', 'fluid-line', [100, 950], [500, 950]), b]), 0.2).reason).toMatch(/at or below the inner base/);
		expect(levelHeight(layerOf([f, level('b', 'inner-base', [300, 900], [320, 1400])]), 0.2).reason).toMatch(/runs up the photograph/);
	});
});

describe('level change between two checks', () => {
	it('gives the change and the loss per year between two dates', () => {
		// 2024-01-01 to 2026-01-01 is 366 + 365 = 731 days (2024 is a leap year, Gregorian calendar);
		// 120 → 114 mm is −6 mm, a loss of 6 / (731 / 365.25) = 2.998 mm a year.
		const c = levelChange(120, 114, '2024-01-01', '2026-01-01');
		expect(c).toMatchObject({ beforeMm: 120, afterMm: 114, changeMm: -6, days: 731 });
		if (c.reason === null) expect(c.lossMmPerYear).toBeCloseTo(6 / (731 / 365.25), 12);
	});

	it('from two photographs, each measured with its own scale', () => {
		// Before: 600 px at 0.2 mm/px = 120 mm. After, photographed closer: 1,140 px at 0.1 mm/px = 114 mm.
		const before = layerOf([level('f', 'fluid-line', [100, 300], [500, 300]), level('b', 'inner-base', [80, 900], [520, 900]), scaleBar(500, 100)]);
		const after = layerOf([level('f', 'fluid-line', [200, 260], [1000, 260]), level('b', 'inner-base', [160, 1400], [1040, 1400]), scaleBar(1000, 100)]);
		const c = fluidLevelChange({ layer: before, date: '2024-01-01' }, { layer: after, date: '2026-01-01' });
		expect(c.changeMm).toBeCloseTo(-6, 9);
		if (c.reason === null) expect(c.lossMmPerYear).toBeCloseTo(6 / (731 / 365.25), 9);
		// A missing mark on one photograph is a reason, not a number.
		const noBase = layerOf([level('f', 'fluid-line', [100, 300], [500, 300]), scaleBar(500, 100)]);
		expect(fluidLevelChange({ layer: before, date: '2024-01-01' }, { layer: noBase, date: '2026-01-01' })).toEqual({
			changeMm: null,
			reason: 'Later photograph: No inner-base line is marked on this photograph.',
		});
		// A scale given overrides the scale bar.
		expect(fluidLevelChange({ layer: before, date: '2024-01-01', mmPerPx: 0.1 }, { layer: after, date: '2026-01-01' }).changeMm).toBeCloseTo(114 - 60, 9);
	});

	it('from the levels recorded at the two checks', () => {
		expect(fluidLevelChangeFromReadings({ levelMm: 180, date: '2025-03-01' }, { levelMm: 178.5, date: '2025-09-01' }).changeMm).toBeCloseTo(-1.5, 12);
		expect(fluidLevelChangeFromReadings({ levelMm: null, date: '2025-03-01' }, { levelMm: 178.5, date: '2025-09-01' })).toEqual({ changeMm: null, reason: 'No fluid level was recorded at the earlier check.' });
		expect(fluidLevelChangeFromReadings({ levelMm: 180, date: '2025-03-01' }, { levelMm: null, date: '2025-09-01' }).reason).toMatch(/later check/);
	});

	it('gives no rate for two checks on one day, and refuses dates in the wrong order or not dates', () => {
		expect(levelChange(100, 99, '2025-05-05', '2025-05-05')).toMatchObject({ changeMm: -1, days: 0, lossMmPerYear: null });
		expect(() => levelChange(100, 99, '2025-05-05', '2024-05-05')).toThrow(/dated before/);
		expect(() => levelChange(100, 99, 'last spring', '2024-05-05')).toThrow(/not a date/);
		expect(() => levelChange(-1, 99, '2024-05-05', '2025-05-05')).toThrow(/0 or more/);
	});
});
