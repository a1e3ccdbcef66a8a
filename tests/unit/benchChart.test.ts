import { describe, expect, it } from 'vitest';
import { headlineChart } from '../../bench/lib/chart.ts';

/** The benchmark report's chart: one bar per headline, its number and verdict in words. */
describe('headlineChart', () => {
	it('draws a bar per headline with its ratio and whether its target was met', () => {
		const svg = headlineChart([
			{ label: 'a ÷ b', ratio: 0.61, target: { value: 0.8, better: 'lower' } },
			{ label: 'c ÷ d', ratio: 0.52, target: { value: 0.7, better: 'higher' } },
			{ label: 'e <x> ÷ f', ratio: 255.3 },
		]);
		expect(svg.match(/<rect x=/g)).toHaveLength(3);
		expect(svg).toContain('0.61× met (target ≤ 0.8×)');
		expect(svg).toContain('0.52× missed (target ≥ 0.7×)');
		expect(svg).toContain('255.30×');
		expect(svg).toContain('e &#60;x&#62; ÷ f');
		// Two dashed target lines, and the 1× baseline drawn darker than the other ticks.
		expect(svg.match(/stroke-dasharray/g)).toHaveLength(2);
		expect(svg).toContain('>1×</text>');
	});
});
