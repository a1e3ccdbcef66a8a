import { memo, useEffect, useReducer, useRef } from 'react';
import { Shape } from 'react-konva';
import type { Mark } from '../../lib/marks/schema.ts';
import type { View } from '../../lib/marks/geometry.ts';
import { SNAPSHOT, sameView, snapshotRegion, snapshotServes } from '../../lib/marks/snapshot.ts';
import { drawAll, type Ctx } from './drawMarks.ts';
import { SnapshotRenderer } from './snapshotRenderer.ts';

/**
 * Every mark of the layer drawn by one Konva shape, straight onto the canvas: with a thousand marks,
 * one node per stroke and label (four or five thousand) cost more than the drawing itself
 * (bench/canvas.ts: 0.18× the frame rate of no marks with nodes, about 0.35× with one shape).
 * MarkShape still draws selected and dragged marks on top.
 *
 * While the view moves, the marks come from a bitmap (lib/marks/snapshot.ts says when one can
 * serve; a worker draws the next one off the main thread), moved and scaled with the photo; once the
 * view has been still for SNAPSHOT.settleMs they are stroked again from the data, so what a person
 * studies is always drawn sharp.
 */
interface Props {
	marks: readonly Mark[];
	view: View;
	box: { w: number; h: number };
	photo: { width: number; height: number };
}

export const AllMarks = memo(function AllMarks({ marks, view, box, photo }: Props) {
	const [, redraw] = useReducer((n: number) => n + 1, 0);
	const renderer = useRef<SnapshotRenderer | null>(null);
	const lastMove = useRef<{ view: View; at: number }>({ view, at: -Infinity });
	if (!sameView(lastMove.current.view, view)) lastMove.current = { view, at: performance.now() };
	const moving = () => performance.now() - lastMove.current.at < SNAPSHOT.settleMs;

	useEffect(() => {
		// A bitmap that arrives while the view moves replaces the one being stretched.
		const r = new SnapshotRenderer(() => moving() && redraw());
		renderer.current = r;
		return () => r.dispose();
		// eslint-disable-next-line react-hooks/exhaustive-deps
	}, []);
	// Still for settleMs: stroke the marks sharp, and have the bitmap for the next gesture drawn.
	useEffect(() => {
		if (lastMove.current.at === -Infinity) return;
		const t = window.setTimeout(redraw, SNAPSHOT.settleMs);
		return () => window.clearTimeout(t);
	}, [view.x, view.y, view.scale]);
	useEffect(() => {
		const r = renderer.current;
		if (!r || moving()) return;
		r.setMarks(marks);
		const dpr = window.devicePixelRatio || 1;
		r.request(snapshotRegion(view, box, photo, dpr), dpr);
	});

	return (
		<Shape
			listening={false}
			perfectDrawEnabled={false}
			sceneFunc={(ctx) => {
				const c = (ctx as unknown as { _context: Ctx })._context;
				// Which way this frame was drawn, for the browser test that checks the two line up.
				const el = (c as CanvasRenderingContext2D).canvas;
				const r = renderer.current;
				const visible = { x: view.x, y: view.y, w: box.w / view.scale, h: box.h / view.scale };
				const strokes = () => {
					el.dataset.marksDrawn = 'strokes';
					drawAll(c, marks, view.scale, visible);
				};
				if (!r || !moving()) return strokes();
				const dpr = window.devicePixelRatio || 1;
				r.setMarks(marks);
				let s = r.current();
				if (!s || !snapshotServes(s.region, view, box, photo)) {
					r.request(snapshotRegion(view, box, photo, dpr), dpr);
					s = r.current() ?? s;
				}
				if (!s) return strokes();
				el.dataset.marksDrawn = 'bitmap';
				c.drawImage(s.image, s.region.x, s.region.y, s.image.width / (s.region.scale * dpr), s.image.height / (s.region.scale * dpr));
			}}
		/>
	);
});
