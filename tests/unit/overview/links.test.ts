import { describe, expect, it } from 'vitest';
import { registerHref } from '../../../src/lib/overview/links.ts';
import { OverviewQuerySchema } from '../../../src/lib/overview/schema.ts';
import { parseRegisterQuery } from '../../../src/lib/specimen/query.ts';
import { LocationLimitsSchema } from '../../../src/lib/locations/schema.ts';

/** The overview's links open the register view of what they count; its inputs are checked at the boundary. */
const LOC = '00000000-0000-4000-8000-0000000000aa';

describe('a figure’s register link', () => {
	it('carries the overview’s collection (as the department) and location with the figure’s own filter', () => {
		const href = registerHref({ collection: 'Zoology teaching series', location: LOC }, { grade: 'poor' });
		expect(href.startsWith('/specimens?')).toBe(true);
		const q = parseRegisterQuery(new URLSearchParams(href.split('?')[1]));
		expect(q.success && q.data).toMatchObject({ department: 'Zoology teaching series', location: LOC, grade: 'poor' });
	});
	it('reads back every filter the overview uses', () => {
		for (const figure of [{ due: 'overdue' }, { check: 'in-review' }, { grade: 'not-checked' }, { priority: 'not-set' }, { hazard: 'lead' }, { flammable: 'yes' }] as const) {
			const q = parseRegisterQuery(new URLSearchParams(registerHref({}, figure).split('?')[1]));
			expect(q.success && q.data).toMatchObject(figure);
		}
		expect(registerHref({})).toBe('/specimens');
	});
});

describe('the overview’s query', () => {
	it('takes a collection and a location, empty meaning all', () => {
		expect(OverviewQuerySchema.parse({ collection: 'Comparative anatomy', location: LOC })).toEqual({ collection: 'Comparative anatomy', location: LOC });
		expect(OverviewQuerySchema.parse({ collection: '', location: '' })).toEqual({});
	});
	it('refuses a location that is not an id, an overlong collection and unknown parameters', () => {
		expect(OverviewQuerySchema.safeParse({ location: "1' OR 1=1" }).success).toBe(false);
		expect(OverviewQuerySchema.safeParse({ collection: 'x'.repeat(121) }).success).toBe(false);
		expect(OverviewQuerySchema.safeParse({ colour: 'red' }).success).toBe(false);
	});
});

describe('a store’s limits', () => {
	const ok = { flammableLimitL: 50, nearLimitPercent: 80, tempMinC: 14, tempMaxC: 22 };
	it('accepts a limit, a near share and a range, or none of them set', () => {
		expect(LocationLimitsSchema.safeParse(ok).success).toBe(true);
		expect(LocationLimitsSchema.safeParse({ flammableLimitL: null, nearLimitPercent: 80, tempMinC: null, tempMaxC: null }).success).toBe(true);
	});
	it('refuses a limit of 0 or less, a share outside 1–100, temperatures outside −20…+40 °C, and coolest above warmest', () => {
		for (const bad of [{ flammableLimitL: 0 }, { flammableLimitL: -5 }, { nearLimitPercent: 0 }, { nearLimitPercent: 101 }, { nearLimitPercent: 79.5 }, { tempMaxC: 41 }, { tempMinC: -21 }, { tempMinC: 25 }, { tempMaxC: '22' }, { extra: 1 }]) {
			expect(LocationLimitsSchema.safeParse({ ...ok, ...bad }).success, JSON.stringify(bad)).toBe(false);
		}
	});
});
