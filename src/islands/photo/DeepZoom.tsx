import { useCallback, useEffect, useRef, useState, type KeyboardEvent, type PointerEvent, type WheelEvent } from 'react';
import { parseInfo, tilesForView, type IiifInfo } from '../../lib/photos/iiifTiles.ts';
import { fitView, panBy, visibleRect, zoomAbout, type View } from '../../lib/photos/viewport.ts';

/**
 * Full-resolution viewing through the photo's IIIF tiles: only the tiles in view are loaded, at
 * the level the zoom needs. Drag to pan, wheel or +/− to zoom about the pointer or the centre,
 * arrow keys to pan, 0 to fit. (The condition map uses the same tile and view arithmetic.)
 */

const MAX_SCALE = 4;

export function DeepZoom({ infoUrl, alt }: { infoUrl: string; alt: string }) {
	const box = useRef<HTMLDivElement>(null);
	const [info, setInfo] = useState<IiifInfo | null>(null);
	const [error, setError] = useState<string | null>(null);
	const [size, setSize] = useState({ w: 800, h: 600 });
	const [view, setView] = useState<View | null>(null);
	const drag = useRef<{ px: number; py: number; x: number; y: number } | null>(null);

	useEffect(() => {
		fetch(infoUrl, { credentials: 'same-origin' })
			.then((r) => (r.ok ? r.json() : Promise.reject(new Error(`The tiles could not be loaded (${r.status}).`))))
			.then((j) => setInfo(parseInfo(j)))
			.catch((e: Error) => setError(e.message));
	}, [infoUrl]);

	useEffect(() => {
		const el = box.current;
		if (!el) return;
		const ro = new ResizeObserver(([entry]) => entry && setSize({ w: entry.contentRect.width, h: entry.contentRect.height }));
		ro.observe(el);
		return () => ro.disconnect();
	}, []);

	const fit = useCallback((): View | null => {
		if (!info) return null;
		return fitView(size, info);
	}, [info, size]);

	useEffect(() => {
		if (info && !view) setView(fit());
	}, [info, view, fit]);

	const zoomAt = (factor: number, sx: number, sy: number) =>
		setView((v) => (v && info ? zoomAbout(v, factor, sx, sy, Math.min(size.w / info.width, size.h / info.height) / 2, MAX_SCALE) : v));

	const pan = (dx: number, dy: number) => setView((v) => (v ? panBy(v, dx, dy) : v));

	const onWheel = (e: WheelEvent) => {
		const r = box.current!.getBoundingClientRect();
		zoomAt(Math.exp(-e.deltaY * 0.0015), e.clientX - r.left, e.clientY - r.top);
	};
	const onPointerDown = (e: PointerEvent) => {
		if (!view) return;
		(e.target as Element).setPointerCapture?.(e.pointerId);
		drag.current = { px: e.clientX, py: e.clientY, x: view.x, y: view.y };
	};
	const onPointerMove = (e: PointerEvent) => {
		const d = drag.current;
		if (!d) return;
		setView((v) => (v ? { ...v, x: d.x - (e.clientX - d.px) / v.scale, y: d.y - (e.clientY - d.py) / v.scale } : v));
	};
	const onKey = (e: KeyboardEvent) => {
		const step = 80;
		const keys: Record<string, () => void> = {
			'+': () => zoomAt(1.4, size.w / 2, size.h / 2),
			'=': () => zoomAt(1.4, size.w / 2, size.h / 2),
			'-': () => zoomAt(1 / 1.4, size.w / 2, size.h / 2),
			'0': () => setView(fit()),
			ArrowLeft: () => pan(-step, 0),
			ArrowRight: () => pan(step, 0),
			ArrowUp: () => pan(0, -step),
			ArrowDown: () => pan(0, step),
		};
		const k = keys[e.key];
		if (k) {
			e.preventDefault();
			k();
		}
	};

	if (error) return <p className="notice-error" role="alert">{error}</p>;
	const base = infoUrl.replace(/\/info\.json$/, '');
	const tiles = info && view ? tilesForView(info, visibleRect(view, size), view.scale * (window.devicePixelRatio || 1)) : [];
	return (
		<div className="space-y-1">
			<div
				ref={box}
				role="img"
				aria-label={`${alt}, zoomable`}
				tabIndex={0}
				className="relative h-[70vh] touch-none select-none overflow-hidden rounded border border-ink-200 bg-ink-900"
				onWheel={onWheel}
				onPointerDown={onPointerDown}
				onPointerMove={onPointerMove}
				onPointerUp={() => (drag.current = null)}
				onPointerCancel={() => (drag.current = null)}
				onKeyDown={onKey}
			>
				{view &&
					tiles.map((t) => (
						<img
							key={t.path}
							src={`${base}/${t.path}`}
							alt=""
							draggable={false}
							className="pointer-events-none absolute max-w-none"
							style={{ left: (t.region.x - view.x) * view.scale, top: (t.region.y - view.y) * view.scale, width: t.region.w * view.scale, height: t.region.h * view.scale }}
						/>
					))}
			</div>
			<p className="text-xs text-ink-500">
				Drag to move · wheel or + / − to zoom · arrow keys to move · 0 to fit{view ? ` · ${Math.round(view.scale * 100)} %` : ''}
			</p>
		</div>
	);
}
