import { Group, Image as KImage, Layer, Shape, Stage } from 'react-konva';
import type { ReactNode } from 'react';
import type { View } from '../../lib/marks/geometry.ts';
import type { Size } from '../../lib/photos/viewport.ts';
import type { PanZoom } from './usePanZoom.ts';

/**
 * One frame of the compare views: images drawn in the frame's photo pixels (a display copy stretched
 * to its photo's full size, or the later photo already warped into this frame), what lies on top of
 * them (changes, control points), and the pointer and keys that move the shared view.
 */
export interface PaneImage {
	key: string;
	image: CanvasImageSource;
	width: number;
	height: number;
	opacity?: number;
	/** Swipe: show this image only right of this screen x. */
	fromScreenX?: number;
}

interface Props {
	label: string;
	testId: string;
	size: Size;
	pz: PanZoom;
	images: PaneImage[];
	overlay?: (c: CanvasRenderingContext2D, view: View) => void;
	onClick?: (at: [number, number]) => void;
	children?: ReactNode;
}

export function ComparePane({ label, testId, size, pz, images, overlay, onClick, children }: Props) {
	const view = pz.view;
	return (
		<div
			tabIndex={0}
			role="application"
			aria-label={label}
			data-testid={testId}
			data-view={view ? JSON.stringify(view) : undefined}
			className="relative touch-none overflow-hidden rounded border border-ink-200 bg-ink-900 focus-visible:outline-glass-600"
			style={{ width: size.w, height: size.h }}
			onWheel={(e) => pz.onWheel(e, e.currentTarget)}
			onKeyDown={(e) => pz.onKey(e)}
		>
			{view && (
				<Stage
					width={size.w}
					height={size.h}
					onPointerDown={(e) => pz.pointer(e, 'down', onClick)}
					onPointerMove={(e) => pz.pointer(e, 'move', onClick)}
					onPointerUp={(e) => pz.pointer(e, 'up', onClick)}
				>
					<Layer x={-view.x * view.scale} y={-view.y * view.scale} scaleX={view.scale} scaleY={view.scale} listening={false}>
						{images.map((im) =>
							im.fromScreenX === undefined ? (
								<KImage key={im.key} image={im.image} x={0} y={0} width={im.width} height={im.height} opacity={im.opacity ?? 1} />
							) : (
								<Group key={im.key} clipX={view.x + im.fromScreenX / view.scale} clipY={view.y} clipWidth={size.w / view.scale} clipHeight={size.h / view.scale}>
									<KImage image={im.image} x={0} y={0} width={im.width} height={im.height} opacity={im.opacity ?? 1} />
								</Group>
							),
						)}
						{overlay && <Shape listening={false} sceneFunc={(ctx) => overlay((ctx as unknown as { _context: CanvasRenderingContext2D })._context, view)} />}
					</Layer>
				</Stage>
			)}
			<span className="pointer-events-none absolute left-2 top-2 rounded bg-ink-900/75 px-2 py-0.5 text-xs font-semibold text-white">{label}</span>
			{children}
		</div>
	);
}
