import { describe, expect, it } from 'vitest';
import { escapeXml, marksSvg } from '../../../src/lib/marks/svg.ts';
import { CASING, HALO, PART_STYLE } from '../../../src/lib/marks/palette.ts';
import type { Mark } from '../../../src/lib/marks/schema.ts';

const base = { authorId: '00000000-0000-4000-8000-000000000001', createdAt: '2026-01-01T00:00:00.000Z', updatedAt: '2026-01-01T00:00:00.000Z' };
const outline: Mark = { ...base, id: 'o1', kind: 'outline', part: 'container', term: 'cracked', severity: 3, note: '', points: [[100, 200], [300, 200], [300, 400]] };
const pin: Mark = { ...base, id: 'p<1>', kind: 'pin', part: 'label', term: 'faded', severity: 1, note: '', at: [1000, 500] };
const scale: Mark = { ...base, id: 's1', kind: 'scale', from: [0, 0], to: [2000, 0], lengthMm: 100 };
const size = { photo: { width: 2000, height: 1000 }, target: { width: 1000, height: 500 } };

describe('marksSvg', () => {
	it('draws one group per mark, in layer order', () => {
		const svg = marksSvg({ marks: [outline, pin, scale] }, size);
		expect(svg.match(/<g /g)).toHaveLength(3);
		expect([...svg.matchAll(/data-mark="([^"]*)"/g)].map((m) => m[1])).toEqual(['o1', 'p&lt;1&gt;', 's1']);
		expect(svg).toMatch(/^<svg xmlns="http:\/\/www.w3.org\/2000\/svg" width="1000" height="500"/);
	});

	it('scales photo pixels to the target: half size halves every coordinate', () => {
		const svg = marksSvg({ marks: [outline] }, size);
		expect(svg).toContain('d="M50 100 L150 100 L150 200 Z"');
		const pinSvg = marksSvg({ marks: [pin] }, size);
		// The ring is centred on (500, 250) with the canvas's 8 px radius.
		expect(pinSvg).toContain('M492 250 A8 8 0 1 0 508 250');
	});

	it('looks like the canvas: part colour over black casing, halo on severe, the part code', () => {
		const svg = marksSvg({ marks: [outline] }, size);
		const strokes = [...svg.matchAll(/stroke="(#[0-9A-Fa-f]{6})" stroke-width="([\d.]+)"/g)].map((m) => [m[1], Number(m[2])]);
		expect(strokes.map((s) => s[0])).toEqual([HALO.colour, CASING.colour, PART_STYLE.container.colour, CASING.colour]);
		expect(strokes[0]![1]).toBeGreaterThan(strokes[1]![1] as number);
		expect(strokes[1]![1]).toBeGreaterThan(strokes[2]![1] as number);
		expect(svg).toContain(`>${PART_STYLE.container.code}</text>`);
		const minor = marksSvg({ marks: [pin] }, size);
		expect(minor).toContain('stroke-dasharray="6 4"');
		expect(minor).not.toContain(HALO.colour);
	});

	it('escapes text and attributes so a mark cannot break the document', () => {
		expect(escapeXml(`<a href="x">'&'</a>`)).toBe('&lt;a href=&quot;x&quot;&gt;&apos;&amp;&apos;&lt;/a&gt;');
		const svg = marksSvg({ marks: [{ ...pin, id: 'a"b' }] }, size);
		expect(svg).toContain('data-mark="a&quot;b"');
		expect(svg).not.toContain('a"b');
	});

	it('an empty layer is an empty, valid SVG of the target size', () => {
		expect(marksSvg({ marks: [] }, size)).toBe('<svg xmlns="http://www.w3.org/2000/svg" width="1000" height="500" viewBox="0 0 1000 500"></svg>');
	});
});
