import { memo } from 'react';
import { Circle, Group, Line, Rect, Text } from 'react-konva';
import type { Preview } from '../../lib/marks/tools/effects.ts';
import { CASING, HALO } from '../../lib/marks/palette.ts';
import { geometry, styleOf, type Drawable } from './markStyle.ts';

/**
 * One mark drawn on the photo in its style (palette.ts): colour by part, weight and dash by
 * severity, the part's letter code beside it so colour is never the only cue, a black casing
 * under every stroke and a white halo under severe ones. Drawn in photo pixels inside the view's
 * transform; widths, dashes and text are divided by the zoom so they stay the same on screen.
 */
/**
 * Memoised on its props (the mark object, zoom, selected, dim): a pan or a change to another mark
 * re-renders the editor, and with 1,000 marks re-rendering every shape each time is what costs
 * (bench/canvas.ts). Marks are immutable in the layer, so an unchanged mark keeps its object.
 */
export const MarkShape = memo(function MarkShape({ mark, zoom, selected, dim }: { mark: Drawable; zoom: number; selected?: boolean; dim?: boolean }) {
	const s = styleOf(mark);
	const g = geometry(mark);
	const k = 1 / zoom;
	const dash = s.dash.map((d) => d * k);
	const stroke = (colour: string, width: number) =>
		g.pin ? null : <Line points={g.points} closed={g.closed} stroke={colour} strokeWidth={width * k} dash={dash.length ? dash : undefined} lineCap="round" lineJoin="round" listening={false} />;
	const r = 7 * k;
	return (
		<Group opacity={dim ? 0.35 : 1} listening={false}>
			{selected && stroke('#ffffff', s.width + 10)}
			{s.halo && stroke(HALO.colour, s.width + HALO.width)}
			{stroke(CASING.colour, s.width + CASING.width)}
			{stroke(s.colour, s.width)}
			{g.pin && (
				<>
					{selected && <Circle x={g.pin[0]} y={g.pin[1]} radius={r + 5 * k} stroke="#ffffff" strokeWidth={3 * k} />}
					<Circle x={g.pin[0]} y={g.pin[1]} radius={r} fill={s.colour} stroke={CASING.colour} strokeWidth={2 * k} />
				</>
			)}
			{mark.kind === 'scale' &&
				[mark.from, mark.to].map(([x, y], i) => <Line key={i} points={[x, y - 10 * k, x, y + 10 * k]} stroke={s.colour} strokeWidth={s.width * k} />)}
			<Text x={g.anchor[0] + 9 * k} y={g.anchor[1] - 9 * k} text={s.code} fontSize={13 * k} fontStyle="bold" fill={s.colour} stroke={CASING.colour} strokeWidth={3 * k} fillAfterStrokeEnabled />
		</Group>
	);
});

/** The gesture under way: the tool's preview. */
export function PreviewShape({ preview, zoom }: { preview: Preview; zoom: number }) {
	const k = 1 / zoom;
	switch (preview.kind) {
		case 'polyline': {
			const pts = [...preview.points, ...(preview.rubber ? [preview.rubber] : [])];
			return (
				<Group listening={false}>
					<Line points={pts.flat()} closed={preview.closed} stroke="#000" strokeWidth={4 * k} />
					<Line points={pts.flat()} closed={preview.closed} stroke="#fff" strokeWidth={2 * k} dash={[6 * k, 4 * k]} />
					{preview.points.map(([x, y], i) => (
						<Circle key={i} x={x} y={y} radius={(i === 0 && preview.closes ? 8 : 4) * k} fill={i === 0 && preview.closes ? '#fff' : '#000'} stroke="#fff" strokeWidth={1.5 * k} />
					))}
				</Group>
			);
		}
		case 'draft':
			return <MarkShape mark={preview.mark} zoom={zoom} />;
		case 'band':
			return <Rect x={preview.x} y={preview.y} width={preview.w} height={preview.h} stroke="#fff" strokeWidth={1.5 * k} dash={[5 * k, 4 * k]} fill="rgba(255,255,255,0.08)" listening={false} />;
		case 'marks':
			return (
				<>
					{preview.marks.map((m) => (
						<MarkShape key={m.id} mark={m} zoom={zoom} selected />
					))}
				</>
			);
	}
}
