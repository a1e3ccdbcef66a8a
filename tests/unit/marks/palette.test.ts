import { describe, expect, it } from 'vitest';
import { PARTS } from '../../../src/lib/check/vocabulary.ts';
import { CASING, HALO, legendEntries, MEASURE_STYLE, PART_STYLE, SEVERITY_STYLE } from '../../../src/lib/marks/palette.ts';

/**
 * Colour science computed here, independently of the module under test.
 *
 * sRGB decoding, IEC 61966-2-1:1999: c ≤ 0.04045 → c/12.92, else ((c + 0.055)/1.055)^2.4; linear
 * sRGB to CIE XYZ by the standard's matrix (D65 white). CIELAB, CIE 15 (Colorimetry):
 * L* = 116 f(Y/Yn) − 16, a* = 500 (f(X/Xn) − f(Y/Yn)), b* = 200 (f(Y/Yn) − f(Z/Zn)), with
 * f(t) = t^(1/3) above (6/29)³ and t/(3·(6/29)²) + 4/29 below. The white point is the matrix applied
 * to sRGB white, i.e. D65. ΔE*ab (CIE76) is the Euclidean distance in L*a*b*.
 *
 * Contrast, WCAG 2.x "relative luminance" and "contrast ratio" definitions
 * (https://www.w3.org/TR/WCAG22/#dfn-relative-luminance): L = 0.2126 R + 0.7152 G + 0.0722 B of the
 * linear components, ratio (L1 + 0.05)/(L2 + 0.05). WCAG 2.0/2.1 print the decoding threshold as
 * 0.03928; no 8-bit value lies between that and 0.04045, so the results are identical.
 * 3:1 is WCAG 2.1 success criterion 1.4.11, Non-text Contrast, for graphical objects.
 */
function linear(hex: string): [number, number, number] {
	const m = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex);
	if (!m) throw new Error(`not a colour: ${hex}`);
	return [m[1]!, m[2]!, m[3]!].map((h) => {
		const c = Number.parseInt(h, 16) / 255;
		return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
	}) as [number, number, number];
}

function xyz(hex: string): [number, number, number] {
	const [r, g, b] = linear(hex);
	return [0.4124 * r + 0.3576 * g + 0.1805 * b, 0.2126 * r + 0.7152 * g + 0.0722 * b, 0.0193 * r + 0.1192 * g + 0.9505 * b];
}

const WHITE = xyz('#FFFFFF');

function lab(hex: string): [number, number, number] {
	const d = 6 / 29;
	const f = (t: number) => (t > d ** 3 ? Math.cbrt(t) : t / (3 * d * d) + 4 / 29);
	const [x, y, z] = xyz(hex);
	const fx = f(x / WHITE[0]);
	const fy = f(y / WHITE[1]);
	const fz = f(z / WHITE[2]);
	return [116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz)];
}

const deltaE76 = (a: string, b: string): number => {
	const [l1, a1, b1] = lab(a);
	const [l2, a2, b2] = lab(b);
	return Math.hypot(l1 - l2, a1 - a2, b1 - b2);
};

const luminance = (hex: string): number => {
	const [r, g, b] = linear(hex);
	return 0.2126 * r + 0.7152 * g + 0.0722 * b;
};
const contrast = (a: string, b: string): number => {
	const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x) as [number, number];
	return (hi + 0.05) / (lo + 0.05);
};

const MID_GREY = '#808080';

describe('the colour formulas in this test', () => {
	it('reproduce published reference values', () => {
		// WCAG 2.x, contrast ratio definition: ratios range from 1:1 to 21:1 (black on white).
		expect(contrast('#000000', '#FFFFFF')).toBeCloseTo(21, 9);
		// Mid-grey on white, 3.95:1 (WebAIM Contrast Checker, from memory).
		expect(contrast(MID_GREY, '#FFFFFF')).toBeCloseTo(3.95, 2);
		// sRGB white is L* = 100, a* = b* = 0 by construction (CIE 15); pure sRGB red is
		// L* 53.24, a* 80.09, b* 67.20 (Bruce Lindbloom's colour calculator, brucelindbloom.com, from memory).
		expect(lab('#FFFFFF').map((v) => Math.round(v * 100) / 100)).toEqual([100, 0, 0]);
		const [l, a, b] = lab('#FF0000');
		expect(l).toBeCloseTo(53.24, 1);
		expect(a).toBeCloseTo(80.09, 1);
		expect(b).toBeCloseTo(67.2, 1);
	});
});

describe('PART_STYLE', () => {
	it('uses the seven chromatic colours of Okabe & Ito (2008)', () => {
		// Okabe & Ito, "Color Universal Design" (2008), jfly.uni-koeln.de/color/: orange E69F00, sky blue
		// 56B4E9, bluish green 009E73, yellow F0E442, blue 0072B2, vermillion D55E00, reddish purple CC79A7.
		const okabeIto = ['#E69F00', '#56B4E9', '#009E73', '#F0E442', '#0072B2', '#D55E00', '#CC79A7'];
		expect(PARTS.map((p) => PART_STYLE[p].colour).sort()).toEqual([...okabeIto].sort());
	});

	it('gives every pair of parts colours at least 20 ΔE*ab (CIE76) apart', () => {
		// 20 ΔE as "clearly different at a glance" is common practice, no published source.
		for (const [i, a] of PARTS.entries()) {
			for (const b of PARTS.slice(i + 1)) {
				expect(deltaE76(PART_STYLE[a].colour, PART_STYLE[b].colour), `${a} vs ${b}`).toBeGreaterThanOrEqual(20);
			}
		}
	});

	it('gives every part a distinct short letter code and a label', () => {
		const codes = PARTS.map((p) => PART_STYLE[p].code);
		expect(new Set(codes).size).toBe(PARTS.length);
		for (const c of codes) expect(c).toMatch(/^[A-Z][a-z]?$/);
		expect(PART_STYLE.specimen).toMatchObject({ code: 'Sp', label: 'Specimen' });
	});

	it('says honestly that no part colour alone reaches 3:1 on mid-grey', () => {
		// The reason for the casing: on #808080 the best of them, yellow, is 2.99:1.
		const below = PARTS.filter((p) => contrast(PART_STYLE[p].colour, MID_GREY) < 3);
		expect(below).toEqual([...PARTS]);
		expect(contrast(PART_STYLE.label.colour, MID_GREY)).toBeCloseTo(2.99, 2);
	});

	it('is carried by its casing: the casing stands 3:1 on mid-grey and every colour 3:1 on the casing', () => {
		// WCAG 2.1 SC 1.4.11 Non-text Contrast: 3:1 for parts of graphical objects.
		expect(contrast(CASING.colour, MID_GREY)).toBeGreaterThanOrEqual(3);
		expect(contrast(CASING.colour, '#FFFFFF')).toBeGreaterThanOrEqual(3);
		for (const p of PARTS) expect(contrast(PART_STYLE[p].colour, CASING.colour), p).toBeGreaterThanOrEqual(3);
		// On a black photo the casing vanishes, and the colour itself then stands on black.
		for (const p of PARTS) expect(contrast(PART_STYLE[p].colour, '#000000'), p).toBeGreaterThanOrEqual(3);
	});
});

describe('SEVERITY_STYLE', () => {
	it('grows in width from minor to severe, dashes only the minor, and halos only the severe', () => {
		expect(SEVERITY_STYLE[1].strokeWidth).toBeLessThan(SEVERITY_STYLE[2].strokeWidth);
		expect(SEVERITY_STYLE[2].strokeWidth).toBeLessThan(SEVERITY_STYLE[3].strokeWidth);
		expect(SEVERITY_STYLE[1].dash.length).toBeGreaterThan(0);
		expect(SEVERITY_STYLE[2].dash).toEqual([]);
		expect(SEVERITY_STYLE[3].dash).toEqual([]);
		expect([1, 2, 3].map((s) => SEVERITY_STYLE[s as 1 | 2 | 3].halo)).toEqual([false, false, true]);
		expect(Object.values(SEVERITY_STYLE).map((s) => s.label)).toEqual(['Minor', 'Moderate', 'Severe']);
	});

	it('has a halo that stands out from the casing and from mid-grey', () => {
		expect(contrast(HALO.colour, CASING.colour)).toBeGreaterThanOrEqual(3);
		expect(contrast(HALO.colour, MID_GREY)).toBeGreaterThanOrEqual(3);
		expect(HALO.width).toBeGreaterThan(CASING.width);
	});
});

describe('MEASURE_STYLE', () => {
	it('draws measurement marks in a colour no part uses, with dash patterns of their own', () => {
		const kinds = ['scale', 'grey', 'level', 'control'] as const;
		for (const k of kinds) {
			for (const p of PARTS) expect(deltaE76(MEASURE_STYLE[k].colour, PART_STYLE[p].colour), `${k} vs ${p}`).toBeGreaterThanOrEqual(20);
			expect(contrast(MEASURE_STYLE[k].colour, MID_GREY)).toBeGreaterThanOrEqual(3);
			expect(contrast(MEASURE_STYLE[k].colour, CASING.colour)).toBeGreaterThanOrEqual(3);
		}
		const dashes = new Set(kinds.filter((k) => MEASURE_STYLE[k].dash.length > 0).map((k) => MEASURE_STYLE[k].dash.join(',')));
		expect(dashes.size).toBe(2);
		for (const s of Object.values(SEVERITY_STYLE)) expect(dashes.has(s.dash.join(','))).toBe(false);
		expect(new Set(kinds.map((k) => MEASURE_STYLE[k].code)).size).toBe(4);
	});
});

describe('legendEntries', () => {
	it('lists every part, severity and measurement mark once, in that order', () => {
		const entries = legendEntries();
		expect(entries.map((e) => `${e.group}:${e.key}`)).toEqual([
			...PARTS.map((p) => `part:${p}`),
			'severity:1',
			'severity:2',
			'severity:3',
			'measure:scale',
			'measure:grey',
			'measure:level',
			'measure:control',
		]);
	});

	it('cannot be used to change the styles', () => {
		const entry = legendEntries().find((e) => e.group === 'severity' && e.key === 1);
		if (entry?.group === 'severity') entry.dash.push(99);
		expect(SEVERITY_STYLE[1].dash).toEqual([6, 4]);
	});
});
