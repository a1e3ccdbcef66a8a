import { describe, expect, it } from 'vitest';
import { fluidRegions } from '../../../src/lib/server/compare/fluidColour.ts';
import { comparedDate } from '../../../src/lib/server/compare/comparable.ts';
import type { Mark, MarkLayer } from '../../../src/lib/marks/schema.ts';
import type { Comparable } from '../../../src/lib/server/compare/comparable.ts';

/** Which marks the server measures fluid colour in, and which day it dates a photograph by. */
const stamp = { authorId: '00000000-0000-4000-8000-000000000001', createdAt: '2026-12-01T10:00:00.000Z', updatedAt: '2026-12-01T10:00:00.000Z' };
const damage = { severity: 1 as const, note: '', ...stamp };
const layer = (marks: Mark[]): MarkLayer => ({ schemaVersion: 1, marks, comments: [] });

describe('the fluid regions of a layer', () => {
	it('takes the largest fluid outline or box, ignoring pins, lines and other parts', () => {
		const l = layer([
			{ id: 'pin', kind: 'pin', part: 'fluid', term: 'low level / evaporation', at: [5, 5], ...damage },
			{ id: 'small-box', kind: 'box', part: 'fluid', term: 'cloudy', x: 0, y: 0, w: 10, h: 10, ...damage },
			{ id: 'big-outline', kind: 'outline', part: 'fluid', term: 'discoloured', points: [[0, 0], [30, 0], [30, 30], [0, 30]], ...damage },
			{ id: 'bigger-specimen', kind: 'outline', part: 'specimen', term: 'tissue loss', points: [[0, 0], [90, 0], [90, 90]], ...damage },
			{ id: 'line', kind: 'path', part: 'fluid', term: 'sediment', points: [[0, 0], [500, 500]], ...damage },
			{ id: 'grey-1', kind: 'grey', x: 1, y: 1, w: 5, h: 5, ...stamp },
			{ id: 'grey-2', kind: 'grey', x: 9, y: 9, w: 50, h: 50, ...stamp },
		]);
		const { fluid, grey } = fluidRegions(l);
		expect(fluid).toMatchObject({ kind: 'outline', points: [[0, 0], [30, 0], [30, 30], [0, 30]], from: 'the fluid mark “discoloured”' });
		expect(grey?.id).toBe('grey-1');
	});

	it('finds nothing to measure in a layer without a fluid outline or box, or the two level lines', () => {
		expect(fluidRegions(layer([{ id: 'pin', kind: 'pin', part: 'fluid', term: 'low level / evaporation', at: [5, 5], ...damage }]))).toEqual({ fluid: null, grey: null });
	});

	it('otherwise samples the clear fluid between the fluid line and the specimen’s top', () => {
		// Fluid line at y = 100, specimen top at y = 300, both from x = 0 to 1000: the band's middle
		// is x 200–800 and y 150–250 (a quarter and three quarters of the way down).
		const lines = (topY: number) =>
			layer([
				{ id: 'f', kind: 'level', level: 'fluid-line', from: [0, 100], to: [1000, 100], ...stamp },
				{ id: 's', kind: 'level', level: 'specimen-top', from: [0, topY], to: [1000, topY], ...stamp },
			]);
		expect(fluidRegions(lines(300)).fluid).toMatchObject({ kind: 'outline', points: [[200, 150], [800, 150], [800, 250], [200, 250]] });
		// The specimen standing out of the fluid leaves no clear fluid above it.
		expect(fluidRegions(lines(90)).fluid).toBeNull();
	});
});

describe('the day a photograph is dated by', () => {
	const photo = (over: Record<string, unknown>) => ({ photo: { capturedRaw: null, capturedAt: null, uploadedAt: new Date('2026-12-03T23:30:00Z'), ...over }, check: null }) as unknown as Pick<Comparable, 'photo' | 'check'>;

	it('is the check’s date when there is a check', () => {
		expect(comparedDate({ ...photo({ capturedRaw: '2026:11:30 09:00:00' }), check: { checkedOn: '2026-12-01' } } as unknown as Comparable)).toBe('2026-12-01');
	});

	it('is the capture instant’s UTC day, as the compare island dates what it shows', () => {
		expect(comparedDate(photo({ capturedRaw: '2026:11:30 00:30:00', capturedAt: new Date('2026-11-29T23:30:00Z') }))).toBe('2026-11-29');
	});

	it('falls back to the upload’s day when the camera recorded no time', () => {
		expect(comparedDate(photo({}))).toBe('2026-12-03');
	});
});
