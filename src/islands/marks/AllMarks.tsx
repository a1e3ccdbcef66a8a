import { memo } from 'react';
import { Shape } from 'react-konva';
import type { Mark } from '../../lib/marks/schema.ts';
import { CASING, HALO } from '../../lib/marks/palette.ts';
import { geometry, styleOf } from './MarkShape.tsx';

/**
 * Every mark of the layer drawn by one Konva shape, straight onto the canvas: with a thousand marks,
 * one node per stroke and label (four or five thousand) cost more than the drawing itself, and a
 * zoom re-rendered them all (bench/canvas.ts: 0.18× the frame rate of no marks before, about 0.38×
 * after; batching strokes of one style into one path measured slower still, so each mark is
 * stroked on its own). Looks like MarkShape, which still draws selected and dragged marks on top.
 */
type Ctx = CanvasRenderingContext2D;

function trace(c: Ctx, points: number[], closed: boolean) {
	c.beginPath();
	c.moveTo(points[0]!, points[1]!);
	for (let i = 2; i < points.length; i += 2) c.lineTo(points[i]!, points[i + 1]!);
	if (closed) c.closePath();
}

function drawMark(c: Ctx, m: Mark, k: number) {
	const s = styleOf(m);
	const g = geometry(m);
	c.setLineDash(s.dash.map((d) => d * k));
	if (g.pin) {
		c.beginPath();
		c.arc(g.pin[0], g.pin[1], 7 * k, 0, Math.PI * 2);
		c.fillStyle = s.colour;
		c.fill();
		c.lineWidth = 2 * k;
		c.strokeStyle = CASING.colour;
		c.stroke();
	} else {
		const passes: [string, number][] = [];
		if (s.halo) passes.push([HALO.colour, s.width + HALO.width]);
		passes.push([CASING.colour, s.width + CASING.width], [s.colour, s.width]);
		for (const [colour, width] of passes) {
			trace(c, g.points, g.closed);
			c.strokeStyle = colour;
			c.lineWidth = width * k;
			c.stroke();
		}
		if (m.kind === 'scale') {
			c.setLineDash([]);
			for (const [x, y] of [m.from, m.to]) {
				trace(c, [x, y - 10 * k, x, y + 10 * k], false);
				c.strokeStyle = s.colour;
				c.lineWidth = s.width * k;
				c.stroke();
			}
		}
	}
	c.setLineDash([]);
	c.font = `bold ${13 * k}px sans-serif`;
	c.lineWidth = 3 * k;
	c.strokeStyle = CASING.colour;
	c.fillStyle = s.colour;
	const x = g.anchor[0] + 9 * k;
	const y = g.anchor[1] - 9 * k + 13 * k;
	c.strokeText(s.code, x, y);
	c.fillText(s.code, x, y);
}

export const AllMarks = memo(function AllMarks({ marks, zoom }: { marks: readonly Mark[]; zoom: number }) {
	return (
		<Shape
			listening={false}
			perfectDrawEnabled={false}
			sceneFunc={(ctx) => {
				const c = (ctx as unknown as { _context: Ctx })._context;
				c.save();
				c.lineCap = 'round';
				c.lineJoin = 'round';
				for (const m of marks) drawMark(c, m, 1 / zoom);
				c.restore();
			}}
		/>
	);
});
