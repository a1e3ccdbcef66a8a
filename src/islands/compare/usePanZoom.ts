import { useCallback, useEffect, useRef, useState, type KeyboardEvent as ReactKeyboardEvent, type WheelEvent as ReactWheelEvent } from 'react';
import type Konva from 'konva';
import type { View } from '../../lib/marks/geometry.ts';
import { fitView, panBy, zoomAbout, type Size } from '../../lib/photos/viewport.ts';

/**
 * Pan and zoom of one photo frame, by mouse, keys and touch: drag to move, wheel or two fingers
 * to zoom about the pointer, + / − / 0 and the arrow keys. A press that does not move is a click,
 * handed on in photo pixels (the compare views place control points with it). Several panes can
 * share one of these, which is how side by side stays linked.
 */
export interface PanZoom {
	view: View | null;
	setView: (v: View) => void;
	fit: () => void;
	zoomAt: (factor: number, sx: number, sy: number) => void;
	onWheel: (e: ReactWheelEvent, box: HTMLElement) => void;
	onKey: (e: ReactKeyboardEvent) => boolean;
	pointer: (e: Konva.KonvaEventObject<PointerEvent>, type: 'down' | 'move' | 'up', onClick?: (at: [number, number]) => void) => void;
}

const CLICK_PX = 4;

export function usePanZoom(size: Size, photo: { width: number; height: number } | null): PanZoom {
	const [view, setViewState] = useState<View | null>(null);
	const moved = useRef(false);
	const press = useRef<{ sx: number; sy: number; x: number; y: number; dragged: boolean } | null>(null);
	const touches = useRef(new Map<number, { x: number; y: number }>());
	const pinch = useRef<number | null>(null);

	const fit = useCallback(() => {
		if (!photo) return;
		moved.current = false;
		setViewState(fitView(size, photo));
	}, [size.w, size.h, photo?.width, photo?.height]);
	// Fit on opening and when the box or the photo changes, until the person moves the view.
	useEffect(() => {
		if (!moved.current) fit();
	}, [fit]);

	const setView = useCallback((v: View) => {
		moved.current = true;
		setViewState(v);
	}, []);
	const zoomAt = useCallback(
		(factor: number, sx: number, sy: number) => {
			if (!photo) return;
			moved.current = true;
			const min = Math.min(size.w / photo.width, size.h / photo.height) / 4;
			setViewState((v) => (v ? zoomAbout(v, factor, sx, sy, min, 8) : v));
		},
		[size.w, size.h, photo?.width, photo?.height],
	);

	const onWheel = (e: ReactWheelEvent, box: HTMLElement) => {
		const r = box.getBoundingClientRect();
		zoomAt(Math.exp(-e.deltaY * 0.0015), e.clientX - r.left, e.clientY - r.top);
	};

	const onKey = (e: ReactKeyboardEvent): boolean => {
		if (!view) return false;
		const step = e.shiftKey ? 200 : 60;
		const pans: Record<string, [number, number]> = { ArrowLeft: [-step, 0], ArrowRight: [step, 0], ArrowUp: [0, -step], ArrowDown: [0, step] };
		if (pans[e.key]) setView(panBy(view, ...pans[e.key]!));
		else if (e.key === '+' || e.key === '=') zoomAt(1.4, size.w / 2, size.h / 2);
		else if (e.key === '-' || e.key === '_') zoomAt(1 / 1.4, size.w / 2, size.h / 2);
		else if (e.key === '0') fit();
		else return false;
		e.preventDefault();
		return true;
	};

	const pointer = (e: Konva.KonvaEventObject<PointerEvent>, type: 'down' | 'move' | 'up', onClick?: (at: [number, number]) => void) => {
		const pos = e.target.getStage()?.getPointerPosition();
		if (!pos || !view) return;
		const native = e.evt;
		if (native.pointerType === 'touch') {
			const t = touches.current;
			if (type === 'up') t.delete(native.pointerId);
			else t.set(native.pointerId, pos);
			if (t.size >= 2) {
				const [a, b] = [...t.values()] as [{ x: number; y: number }, { x: number; y: number }];
				const d = Math.hypot(a.x - b.x, a.y - b.y) || 1;
				if (pinch.current !== null) zoomAt(d / pinch.current, (a.x + b.x) / 2, (a.y + b.y) / 2);
				pinch.current = d;
				press.current = null;
				return;
			}
			if (pinch.current !== null) {
				if (t.size === 0) pinch.current = null;
				return;
			}
		}
		if (type === 'down') {
			press.current = { sx: pos.x, sy: pos.y, x: view.x, y: view.y, dragged: false };
			return;
		}
		const p = press.current;
		if (!p) return;
		if (Math.hypot(pos.x - p.sx, pos.y - p.sy) > CLICK_PX) p.dragged = true;
		if (p.dragged) setView({ ...view, x: p.x - (pos.x - p.sx) / view.scale, y: p.y - (pos.y - p.sy) / view.scale });
		if (type === 'up') {
			press.current = null;
			if (!p.dragged && onClick) onClick([view.x + pos.x / view.scale, view.y + pos.y / view.scale]);
		}
	};

	return { view, setView, fit, zoomAt, onWheel, onKey, pointer };
}
