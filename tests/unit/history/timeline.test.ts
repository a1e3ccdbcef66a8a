import { describe, expect, it } from 'vitest';
import { buildTimeline } from '../../../src/lib/history/timeline.ts';
import { TimelineSchema } from '../../../src/lib/history/schema.ts';
import type { CheckView } from '../../../src/lib/check/view.ts';
import type { SpecimenView } from '../../../src/lib/specimen/view.ts';
import { PARTS } from '../../../src/lib/check/vocabulary.ts';

/** The history of a specimen from its record and checks: what is drawn, what is fitted, what it says. */
const specimen: SpecimenView = {
	id: '00000000-0000-4000-8000-000000000001',
	objectNumber: 'TL.1',
	title: 'Test newt',
	description: '',
	department: '',
	storageLocation: null,
	preservativeRecorded: '',
	preservativeKind: 'ethanol',
	containerShape: 'cylinder',
	innerWidthMm: 100,
	innerDepthMm: null,
	innerHeightMm: 200,
	specimenTopMm: 150,
	containerMaterial: 'soda-lime',
	closureType: 'glass-lid',
	sealType: 'wax',
	hazards: [],
	nextCheckDue: null,
	currentGrade: 'fair',
	currentPriority: 'routine',
	lastCheckedOn: null,
	version: 0,
	createdAt: '2020-01-01T00:00:00.000Z',
	updatedAt: '2020-01-01T00:00:00.000Z',
};
let n = 0;
const check = (checkedOn: string, levelMm: number | null, over: Partial<CheckView> = {}): CheckView => ({
	id: `00000000-0000-4000-8000-${String(++n).padStart(12, '0')}`,
	specimen: { id: specimen.id, objectNumber: 'TL.1', title: 'Test newt', hazards: [] },
	checkedOn,
	examiner: { id: 'x', name: 'Examiner' },
	reason: 'routine-survey',
	state: 'approved',
	parts: Object.fromEntries(PARTS.map((p) => [p, { grade: 'good', terms: [], note: '' }])) as unknown as CheckView['parts'],
	overallGrade: 'good',
	overallOverrideReason: null,
	priority: 'none',
	nextCheckDue: null,
	notes: '',
	fluid: { readingPercentVol: null, tempC: 18, glass: 'soda-lime', realPercentVol: 70 - n / 10, formaldehyde: 'not-tested', pH: null, levelMm, method: '' },
	correctsCheckId: null,
	submittedAt: null,
	reviewer: null,
	reviewedAt: null,
	reviewComment: null,
	version: 0,
	updatedAt: '2020-01-01T00:00:00.000Z',
	...over,
});

describe('a specimen’s timeline', () => {
	// Newest first, as the checks API gives them: four approved checks falling 2 mm a year, then a draft.
	const approved = [check('2020-01-01', 180), check('2021-01-01', 178), check('2022-01-01', 176), check('2023-01-01', 174)];
	const draft = check('2023-06-01', 150, { state: 'draft', overallGrade: null });
	const t = buildTimeline(specimen, [draft, ...[...approved].reverse()], '2023-06-01');

	it('lists every check oldest first and parses with its schema', () => {
		expect(TimelineSchema.safeParse(t).success).toBe(true);
		expect(t.checks.map((c) => c.checkedOn)).toEqual(['2020-01-01', '2021-01-01', '2022-01-01', '2023-01-01', '2023-06-01']);
		expect(t.checks.every((c) => c.yellowness === null)).toBe(true);
	});
	it('draws an open check but fits approved ones only', () => {
		expect(t.series.level.points.map((p) => p.used)).toEqual([true, true, true, true, false]);
		expect(t.series.level.trend.kind === 'trend' && t.series.level.trend.perYear).toBeCloseTo(-2, 1);
	});
	it('gives the loss as a volume: 2 mm a year × π × 50² / 1000 = 15.7 mL a year', () => {
		expect(t.series.level.mlPerYear).toBeCloseTo(-2 * 7.854, 0);
	});
	it('forecasts the fluid at the specimen top: (174 − 150) ÷ 2 = 12 years after the last approved check', () => {
		expect(t.series.level.forecast?.kind).toBe('date');
		expect(t.series.level.forecast?.message).toMatch(/top of the specimen in about 12 years/);
	});
	it('has a strength series with the 65 % vol line for ethanol, and an empty yellowness slot', () => {
		expect(t.series.strength.threshold).toBe(65);
		expect(t.series.yellowness.points).toEqual([]);
		expect(t.series.yellowness.forecast).toBeNull();
	});
	it('leaves out a check an approved correction replaces, and a fill before a top-up', () => {
		const wrong = check('2022-01-01', 120);
		const fix = check('2022-02-01', 176, { correctsCheckId: wrong.id });
		const topped = check('2023-01-01', 198);
		const after = [check('2024-01-01', 196), check('2025-01-01', 194)];
		const u = buildTimeline(specimen, [...[...after].reverse(), topped, fix, wrong, ...approved.slice(0, 2).reverse()], '2025-06-01');
		expect(u.checks.find((c) => c.id === wrong.id)?.corrected).toBe(true);
		expect(u.series.level.points.find((p) => p.checkId === wrong.id)).toMatchObject({ approved: false, used: false });
		expect(u.fillStartedOn).toBe('2023-01-01');
		expect(u.series.level.points.filter((p) => p.used).map((p) => p.value)).toEqual([198, 196, 194]);
	});
	it('has no strength line for a fluid an alcohol meter does not read true', () => {
		const iso = buildTimeline({ ...specimen, preservativeKind: 'propan-2-ol' }, [...approved].reverse(), '2023-06-01');
		expect(iso.series.strength.threshold).toBeNull();
		expect(iso.series.strength.forecast).toBeNull();
	});
});
