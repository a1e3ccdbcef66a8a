import type { Analysis } from '../../lib/compare/analysis.ts';
import { CHANGE_CLASSES, type MarkChange, type Sizes } from '../../lib/compare/changes.ts';
import { CHANGE_STYLE } from '../../lib/compare/changeStyle.ts';
import type { LevelChange } from '../../lib/compare/fluid.ts';

/**
 * What changed between the two photographs: the marks matched and classified, the noise threshold
 * stated, the fluid level from the level lines and from the readings, and the fluid colour with its
 * reliability. Sizes in mm when both photographs have a scale bar, otherwise in pixels.
 */
const n1 = (v: number) => v.toLocaleString('en-GB', { maximumFractionDigits: 1 });
const n2 = (v: number) => v.toLocaleString('en-GB', { maximumFractionDigits: 2, minimumFractionDigits: 2 });
const signed = (v: number) => `${v > 0 ? '+' : v < 0 ? '−' : '±'}${n1(Math.abs(v))}`;

function sizeText(c: MarkChange, areaUnit: string, lengthUnit: string): string {
	const area = areaUnit === 'mm²' ? c.areaMm2 : c.areaPx2;
	const length = lengthUnit === 'mm' ? c.lengthMm : c.lengthPx;
	const show = (s: Sizes | null, unit: string) => (s ? `${s.before === null ? '–' : n1(s.before)} → ${s.after === null ? '–' : n1(s.after)} ${unit} (${signed(s.change)})` : '');
	return [show(area, areaUnit), show(length, lengthUnit)].filter(Boolean).join(' · ');
}

function Level({ title, l }: { title: string; l: LevelChange }) {
	return (
		<p>
			<span className="font-semibold">{title}: </span>
			{l.changeMm === null ? (
				<span className="text-ink-600">{l.reason}</span>
			) : (
				<span data-testid="level-change">
					{n1(l.beforeMm)} → {n1(l.afterMm)} mm above the inner base ({signed(l.changeMm)} mm over {Math.round(l.days).toLocaleString('en-GB')} days
					{l.lossMmPerYear !== null && `; ${l.lossMmPerYear >= 0 ? 'losing' : 'gaining'} ${n1(Math.abs(l.lossMmPerYear))} mm a year`})
				</span>
			)}
		</p>
	);
}

export function ChangePanel({ analysis }: { analysis: Analysis }) {
	const { changes, summary, basis, thresholds } = analysis.changes;
	const listed = changes.filter((c) => c.change !== 'unchanged');
	const colour = analysis.colour;
	return (
		<section className="card space-y-3" aria-labelledby="change-heading" data-testid="change-summary">
			<h2 id="change-heading" className="text-lg">What changed</h2>
			{!analysis.aligned && <p className="notice-caution text-sm">Not lined up: marks are compared where they sit in each photograph, so a moved camera reads as change.</p>}
			<ul className="flex flex-wrap gap-2 text-sm" aria-label="Changes by kind">
				{CHANGE_CLASSES.map((k) => (
					<li key={k} className="rounded border border-ink-200 px-2 py-0.5">
						<span className="font-bold" style={{ color: CHANGE_STYLE[k].colour === '#ffffff' ? undefined : CHANGE_STYLE[k].colour, textShadow: '0 0 1px #000' }}>
							{CHANGE_STYLE[k].letter}
						</span>{' '}
						{summary.counts[k]} {CHANGE_STYLE[k].label}
					</li>
				))}
			</ul>
			{listed.length > 0 ? (
				<ul className="space-y-1 text-sm" data-testid="change-list">
					{listed.map((c, i) => (
						<li key={`${c.before?.id ?? ''}-${c.after?.id ?? ''}-${i}`}>
							<span className="font-bold">{CHANGE_STYLE[c.change].letter}</span> <span className="capitalize">{c.part}</span>, {c.term}: <strong>{CHANGE_STYLE[c.change].label}</strong>
							{c.relative !== null && ` (${signed(c.relative * 100)} %)`}
							<span className="block text-ink-600">{sizeText(c, basis.area, basis.length)}</span>
						</li>
					))}
				</ul>
			) : (
				<p className="text-sm text-ink-600">No damage mark changed beyond the threshold.</p>
			)}
			<p className="text-xs text-ink-600">
				A matched mark counts as grown or shrunk only when its size changed by at least {Math.round(thresholds.relative * 100)} % and by at least{' '}
				{basis.area === 'mm²' ? `${thresholds.absMm2} mm² (${thresholds.absMm} mm for lines)` : `${thresholds.absPx2} px² (${thresholds.absPx} px for lines)`}; marks match when part and damage agree and
				their regions overlap by at least {Math.round(thresholds.minIoU * 100)} % (intersection over union). Smaller changes are taken as drawing noise: a rule of thumb, no published source.
			</p>
			<h3 className="text-base">Fluid</h3>
			<div className="space-y-1 text-sm" data-testid="fluid-change">
				<Level title="Level from the level lines" l={analysis.levelFromMarks} />
				<Level title="Level from the readings" l={analysis.levelFromReadings} />
				{colour.change ? (
					<p data-testid="colour-change">
						<span className="font-semibold">Colour: </span>ΔE00 {n2(colour.change.deltaE00)}; yellowness (ASTM E313) {n1(colour.before!.yellowness)} → {n1(colour.after!.yellowness)} ({signed(colour.change.deltaYellowness)})
						{'measuredIn' in colour.before! && <span className="block text-ink-600">Measured in {String((colour.before as { measuredIn?: string }).measuredIn)} on each photograph, white-balanced on its grey card.</span>}
						{!colour.change.reliable && <span className="block text-alert-700">Unreliable: {colour.change.reasons.join(' ')}</span>}
					</p>
				) : (
					<p className="text-ink-600">
						<span className="font-semibold">Colour: </span>
						{colour.problem}
					</p>
				)}
			</div>
		</section>
	);
}
