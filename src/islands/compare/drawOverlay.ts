import type { View } from '../../lib/marks/geometry.ts';
import type { MarkChange } from '../../lib/compare/changes.ts';
import { markRegion } from '../../lib/compare/overlap.ts';
import type { Matrix3 } from '../../lib/compare/registration.ts';
import { CHANGE_STYLE } from '../../lib/compare/changeStyle.ts';

/**
 * What the compare views draw over the photographs, in the frame's photo pixels (widths divided by
 * the zoom so they stay the same on screen): each change as its region with a black casing, and the
 * control points as numbered rings.
 */
type Ctx = CanvasRenderingContext2D;

export function drawChanges(c: Ctx, changes: readonly MarkChange[], transform: Matrix3 | null, view: View, show: (m: MarkChange) => boolean) {
	const k = 1 / view.scale;
	c.save();
	c.lineJoin = 'round';
	c.lineCap = 'round';
	for (const ch of changes) {
		if (!show(ch)) continue;
		const s = CHANGE_STYLE[ch.change];
		// What is there now, seen in this frame; for what has gone, where it was.
		const region = ch.after ? markRegion(ch.after, transform) : markRegion(ch.before!);
		for (const [w, colour] of [[s.width + 3, '#000000'], [s.width, s.colour]] as const) {
			c.beginPath();
			for (const polygon of region) for (const ring of polygon) ring.forEach(([x, y], i) => (i ? c.lineTo(x, y) : c.moveTo(x, y)));
			c.setLineDash(s.dash.map((d) => d * k));
			c.lineWidth = w * k;
			c.strokeStyle = colour;
			c.stroke();
		}
		const [x, y] = region[0]?.[0]?.[0] ?? [0, 0];
		c.setLineDash([]);
		c.font = `bold ${14 * k}px sans-serif`;
		c.lineWidth = 3 * k;
		c.strokeStyle = '#000000';
		c.fillStyle = s.colour;
		c.strokeText(s.letter, x + 6 * k, y - 6 * k);
		c.fillText(s.letter, x + 6 * k, y - 6 * k);
	}
	c.restore();
}

export function drawControlPoints(c: Ctx, points: readonly { n: number; at: readonly [number, number] }[], view: View, flagged: ReadonlySet<number>, active: number | null) {
	const k = 1 / view.scale;
	c.save();
	for (const { n, at } of points) {
		const [x, y] = at;
		const colour = flagged.has(n) ? '#e0282e' : n === active ? '#ff9f1c' : '#3ddc97';
		c.beginPath();
		c.arc(x, y, 9 * k, 0, Math.PI * 2);
		c.lineWidth = 5 * k;
		c.strokeStyle = '#000000';
		c.stroke();
		c.lineWidth = 2.5 * k;
		c.strokeStyle = colour;
		c.stroke();
		c.beginPath();
		c.moveTo(x - 14 * k, y);
		c.lineTo(x + 14 * k, y);
		c.moveTo(x, y - 14 * k);
		c.lineTo(x, y + 14 * k);
		c.lineWidth = 1.5 * k;
		c.stroke();
		c.font = `bold ${14 * k}px sans-serif`;
		c.lineWidth = 3 * k;
		c.strokeStyle = '#000000';
		c.fillStyle = colour;
		c.strokeText(String(n), x + 12 * k, y - 12 * k);
		c.fillText(String(n), x + 12 * k, y - 12 * k);
	}
	c.restore();
}
