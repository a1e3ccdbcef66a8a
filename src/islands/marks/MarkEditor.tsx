import { useQuery } from '@tanstack/react-query';
import { useCallback, useEffect, useMemo, useRef, useState, type KeyboardEvent as ReactKeyboardEvent } from 'react';
import { Layer, Rect, Stage } from 'react-konva';
import { handles } from '../../lib/marks/tools/shapes.ts';
import type Konva from 'konva';
import { QueryRoot } from '../QueryRoot.tsx';
import { api } from '../../lib/client/api.ts';
import type { PhotoRecord } from '../../lib/photos/view.ts';
import { parseInfo, tilesForView, type IiifInfo } from '../../lib/photos/iiifTiles.ts';
import { fitView, visibleRect, zoomAbout } from '../../lib/photos/viewport.ts';
import { toPhoto, screenPoint, type View } from '../../lib/marks/geometry.ts';
import { MarkLayerSchema, type Level, type MarkLayer, type Severity } from '../../lib/marks/schema.ts';
import type { LayerMode } from '../../lib/marks/policy.ts';
import { TOOL_LIST, reduceTool, startTool, type ActiveTool } from '../../lib/marks/tools/index.ts';
import type { Effect, ToolId } from '../../lib/marks/tools/effects.ts';
import type { ToolEvent } from '../../lib/marks/tools/events.ts';
import { applyEffects, MarkEditError } from '../../lib/marks/tools/apply.ts';
import { canRedo, canUndo, createHistory, push, redo, undo, type History } from '../../lib/marks/tools/history.ts';
import { matchShortcut } from '../../lib/marks/tools/shortcuts.ts';
import { mergeLayers } from '../../lib/marks/merge.ts';
import type { Part } from '../../lib/check/vocabulary.ts';
import { MarkShape, PreviewShape } from './MarkShape.tsx';
import { AllMarks } from './AllMarks.tsx';
import { TileImage } from './TileImage.tsx';
import { readPending, useLayerSync } from './useLayerSync.ts';
import { MarkSidebar, type DamageChoice } from './MarkSidebar.tsx';

/**
 * The mark-up canvas: the photograph at screen size, zoomable to full resolution through its
 * IIIF tiles (only the tiles in view are loaded), with the tools of src/lib/marks/tools turning
 * pointer and key events into marks. Each finished gesture is one undo step and is saved a moment
 * later; curators, approved checks and checks in review open read-only, reviewers may comment.
 */
interface LayerAnswer {
	layer: MarkLayer;
	version: number;
	mode: LayerMode;
	reason: string | null;
	photo: { width: number; height: number };
}

export default function MarkEditor({ photoId, userId }: { photoId: string; userId: string }) {
	return (
		<QueryRoot>
			<Loader photoId={photoId} userId={userId} />
		</QueryRoot>
	);
}

function Loader({ photoId, userId }: { photoId: string; userId: string }) {
	const photo = useQuery({ queryKey: ['photo', photoId], queryFn: () => api<{ photo: PhotoRecord }>(`/api/photos/${photoId}`) });
	const marks = useQuery({ queryKey: ['marks', photoId], queryFn: () => api<LayerAnswer>(`/api/photos/${photoId}/marks`), staleTime: Infinity });
	const terms = useQuery({ queryKey: ['terms'], queryFn: () => api<{ terms: Record<Part, string[]> }>('/api/vocabulary/terms') });
	const info = useQuery({ queryKey: ['tiles', photoId], enabled: !!photo.data, queryFn: async () => parseInfo(await api<unknown>(photo.data!.photo.urls.tiles)) });
	const failed = photo.error ?? marks.error ?? terms.error ?? info.error;
	if (failed) return <p className="notice-error" role="alert">{failed.message}</p>;
	if (!photo.data || !marks.data || !terms.data || !info.data) return <p role="status">Loading the photograph and its marks…</p>;
	return <Editor photo={photo.data.photo} answer={marks.data} terms={terms.data.terms} info={info.data} userId={userId} />;
}

const SCREEN_TOLERANCE = 8;
let idCounter = 0;
const newId = () => `m${Date.now().toString(36)}${(idCounter++).toString(36)}${Math.random().toString(36).slice(2, 6)}`;

function Editor({ photo, answer, terms, info, userId }: { photo: PhotoRecord; answer: LayerAnswer; terms: Record<Part, string[]>; info: IiifInfo; userId: string }) {
	const editable = answer.mode === 'edit';
	const box = useRef<HTMLDivElement>(null);
	const [size, setSize] = useState({ w: 900, h: 640 });
	const [view, setView] = useState<View | null>(null);
	const [history, setHistory] = useState<History<MarkLayer>>(() => createHistory(answer.layer));
	const [tool, setTool] = useState<ActiveTool>(() => startTool('select'));
	const [damage, setDamage] = useState<DamageChoice>({ part: 'seal', term: terms.seal[0] ?? '', severity: 2 as Severity, note: '' });
	const [level, setLevel] = useState<Level>('fluid-line');
	const [scaleMm, setScaleMm] = useState(100);
	const [hidden, setHidden] = useState<Set<Part>>(new Set());
	const [notice, setNotice] = useState<string | null>(null);
	const [restored, setRestored] = useState<MarkLayer | null>(null);
	const sync = useLayerSync(photo.id, { layer: answer.layer, version: answer.version }, editable || answer.mode === 'comment');
	const layer = history.present;
	const pan = useRef<{ sx: number; sy: number; x: number; y: number } | null>(null);
	const spaceDown = useRef(false);
	// Two fingers on a touch screen zoom about their midpoint (and never draw).
	const touches = useRef(new Map<number, { x: number; y: number }>());
	const pinch = useRef<{ d: number } | null>(null);

	// A copy left in this browser by a tab that closed before the server had it.
	useEffect(() => {
		const p = readPending(photo.id);
		if (p && JSON.stringify(p.layer) !== JSON.stringify(answer.layer)) {
			const parsed = MarkLayerSchema.safeParse(p.baseVersion === answer.version ? p.layer : mergeLayers(p.base, p.layer, answer.layer).layer);
			if (parsed.success) setRestored(parsed.data);
		}
		// eslint-disable-next-line react-hooks/exhaustive-deps
	}, []);

	useEffect(() => {
		const el = box.current;
		if (!el) return;
		const ro = new ResizeObserver(([e]) => e && setSize({ w: Math.max(200, e.contentRect.width), h: Math.max(200, e.contentRect.height) }));
		ro.observe(el);
		return () => ro.disconnect();
	}, []);

	const fit = useCallback((): View => {
		return fitView(size, photo);
	}, [size, photo.width, photo.height]);
	// Fit on opening and whenever the box changes size, until the person zooms or pans themselves.
	const moved = useRef(false);
	useEffect(() => {
		if (!moved.current) setView(fit());
	}, [fit]);

	const commitLayer = useCallback(
		(next: MarkLayer) => {
			setHistory((h) => push(h, next));
			sync.changed(next);
		},
		[sync],
	);

	const visibleMarks = useMemo(() => layer.marks.filter((m) => !('part' in m) || !hidden.has(m.part)), [layer, hidden]);

	const run = useCallback(
		(event: ToolEvent) => {
			if (!view) return;
			const ctx = { tolerancePx: SCREEN_TOLERANCE / view.scale, marks: visibleMarks, photo: { width: photo.width, height: photo.height }, level };
			const { active, effects } = reduceTool(tool, event, ctx);
			setTool(active);
			if (effects.length === 0) return;
			const changes = effects.filter((e: Effect) => e.kind !== 'select');
			if (changes.length === 0 || !editable) return;
			apply(changes);
		},
		// eslint-disable-next-line react-hooks/exhaustive-deps
		[view, tool, visibleMarks, photo, level, editable, layer, userId, damage, scaleMm, commitLayer],
	);

	const selected = tool.id === 'select' ? tool.state.selected : [];

	/** Runs a gesture's changes (or a properties edit) into the layer as one undo step. */
	function apply(effects: Effect[]) {
		try {
			const next = applyEffects(layer, effects, { newId, now: new Date().toISOString(), authorId: userId, damage, level, lengthMm: scaleMm });
			if (next !== layer) commitLayer(next);
			setNotice(null);
		} catch (err) {
			if (err instanceof MarkEditError) setNotice(err.message);
			else throw err;
		}
	}

	const zoomAt = (factor: number, sx: number, sy: number) => {
		moved.current = true;
		setView((v) => (v ? zoomAbout(v, factor, sx, sy, Math.min(size.w / photo.width, size.h / photo.height) / 4, 8) : v));
	};

	const pointer = (e: Konva.KonvaEventObject<PointerEvent>, type: 'down' | 'move' | 'up') => {
		const stage = e.target.getStage();
		const pos = stage?.getPointerPosition();
		if (!pos || !view) return;
		const native = e.evt;
		if (native.pointerType === 'touch' && pinchGesture(type, native.pointerId, pos)) return;
		// Pan: middle button, or Space held, or any drag while reading.
		if (type === 'down' && (native.button === 1 || spaceDown.current || (!editable && tool.id !== 'select'))) {
			pan.current = { sx: pos.x, sy: pos.y, x: view.x, y: view.y };
			moved.current = true;
			return;
		}
		if (pan.current) {
			if (type === 'move') {
				const p = pan.current;
				setView({ ...view, x: p.x - (pos.x - p.sx) / view.scale, y: p.y - (pos.y - p.sy) / view.scale });
			} else if (type === 'up') pan.current = null;
			return;
		}
		const at = toPhoto(screenPoint(pos.x, pos.y), view);
		run({ type, at: [at[0], at[1]], shift: native.shiftKey, alt: native.altKey, time: native.timeStamp });
	};

	/** Undo or redo one gesture; the restored layer is saved like any other change. */
	const step = (which: 'undo' | 'redo') => {
		if (!editable || !(which === 'undo' ? canUndo(history) : canRedo(history))) return;
		const h = which === 'undo' ? undo(history) : redo(history);
		setHistory(h);
		sync.changed(h.present);
	};

	/** True while two fingers are down: their moves zoom instead of reaching the tool. */
	const pinchGesture = (type: 'down' | 'move' | 'up', id: number, pos: { x: number; y: number }): boolean => {
		const t = touches.current;
		if (type === 'up') {
			t.delete(id);
			const was = pinch.current !== null;
			if (t.size < 2) pinch.current = null;
			return was;
		}
		t.set(id, pos);
		if (t.size < 2) return false;
		const [a, b] = [...t.values()] as [{ x: number; y: number }, { x: number; y: number }];
		const d = Math.hypot(a.x - b.x, a.y - b.y) || 1;
		if (!pinch.current) {
			run({ type: 'cancel' });
			pinch.current = { d };
		} else {
			zoomAt(d / pinch.current.d, (a.x + b.x) / 2, (a.y + b.y) / 2);
			pinch.current.d = d;
		}
		return true;
	};

	const onKey = (e: ReactKeyboardEvent) => {
		if ((e.target as HTMLElement).closest('input, select, textarea')) return;
		if (e.key === ' ') {
			spaceDown.current = e.type === 'keydown';
			e.preventDefault();
			return;
		}
		if (e.type !== 'keydown') return;
		const input = { type: 'key' as const, key: e.key, shift: e.shiftKey, ctrl: e.ctrlKey, meta: e.metaKey, alt: e.altKey };
		const s = matchShortcut(input);
		if (!s) return;
		e.preventDefault();
		if (s.action === 'nudge' && (selected.length === 0 || !editable)) {
			const step = (e.shiftKey ? 200 : 60) / (view?.scale ?? 1);
			const d: Record<string, [number, number]> = { ArrowLeft: [-step, 0], ArrowRight: [step, 0], ArrowUp: [0, -step], ArrowDown: [0, step] };
			const [dx, dy] = d[e.key] ?? [0, 0];
			moved.current = true;
			setView((v) => (v ? { ...v, x: v.x + dx, y: v.y + dy } : v));
			return;
		}
		if (s.to === 'tool') return run(input);
		if (s.action.startsWith('tool:')) {
			const id = s.action.slice(5) as ToolId;
			if (editable || id === 'select') setTool(startTool(id));
		} else if (s.action === 'undo') step('undo');
		else if (s.action === 'redo') step('redo');
		else if (s.action === 'fit') {
			moved.current = false;
			setView(fit());
		}
		else if (s.action === 'zoom-in') zoomAt(1.4, size.w / 2, size.h / 2);
		else if (s.action === 'zoom-out') zoomAt(1 / 1.4, size.w / 2, size.h / 2);
	};

	const tiles = view ? tilesForView(info, visibleRect(view, size), view.scale * (window.devicePixelRatio || 1)) : [];
	const base = photo.urls.tiles.replace(/\/info\.json$/, '');
	const previewMarks = tool.state.preview?.kind === 'marks' ? new Set(tool.state.preview.marks.map((m) => m.id)) : new Set<string>();

	const selectIds = (ids: string[]) => {
		const t = startTool('select');
		if (t.id === 'select') setTool({ id: 'select', state: { ...t.state, selected: ids } });
	};
	const patchSelected = (effects: Effect[]) => apply(effects);

	return (
		<div className="grid gap-4 lg:grid-cols-[auto_1fr_20rem]" onKeyDown={onKey} onKeyUp={onKey}>
			<nav aria-label="Tools" className="flex flex-row flex-wrap gap-1 lg:flex-col">
				{TOOL_LIST.filter((t) => editable || t.id === 'select').map((t) => (
					<button
						key={t.id}
						type="button"
						title={`${t.hint} (${t.key.toUpperCase()})`}
						aria-pressed={tool.id === t.id}
						className={`btn-secondary justify-start ${tool.id === t.id ? 'border-glass-600 bg-glass-50' : ''}`}
						onClick={() => setTool(startTool(t.id))}
					>
						<kbd className="rounded bg-ink-100 px-1 text-xs">{t.key.toUpperCase()}</kbd> {t.label}
					</button>
				))}
				{editable && (
					<>
						<button type="button" className="btn-secondary" disabled={!canUndo(history)} onClick={() => step('undo')}>
							Undo
						</button>
						<button type="button" className="btn-secondary" disabled={!canRedo(history)} onClick={() => step('redo')}>
							Redo
						</button>
					</>
				)}
			</nav>
			<div className="space-y-2">
				<SyncBadge state={sync.state} message={sync.message} mode={answer.mode} reason={answer.reason} />
				{restored && (
					<div className="notice-caution" role="status">
						Marks from an earlier visit were not saved yet.{' '}
						<button type="button" className="underline" onClick={() => (commitLayer(restored), setRestored(null))}>
							Restore them
						</button>{' '}
						or{' '}
						<button type="button" className="underline" onClick={() => (localStorage.removeItem(`meniscus-marks-${photo.id}`), setRestored(null))}>
							discard them
						</button>
						.
					</div>
				)}
				{sync.conflict && (
					<div className="notice-error" role="alert">
						{sync.message}{' '}
						<button type="button" className="underline" onClick={() => { const m = mergeLayers(sync.base().layer, layer, sync.conflict!.layer); setHistory((h) => push(h, m.layer)); sync.resolve(m.layer); if (m.contested.length) setNotice(`Both of you changed ${m.contested.length} mark(s); yours were kept: ${m.contested.join(', ')}.`); }}>
							Merge mine with theirs
						</button>{' '}
						·{' '}
						<button type="button" className="underline" onClick={() => { setHistory(createHistory(sync.conflict!.layer)); sync.resolve(sync.conflict!.layer); }}>
							Load theirs
						</button>
					</div>
				)}
				{(notice || tool.state.message) && <p className="notice-caution" role="status">{notice ?? tool.state.message}</p>}
				<div
					ref={box}
					tabIndex={0}
					role="application"
					aria-label={`Photograph with ${layer.marks.length} marks; ${editable ? 'press the tool keys to draw' : 'read-only'}`}
					className="relative h-[70vh] touch-none overflow-hidden rounded border border-ink-200 bg-ink-900 focus-visible:outline-glass-600"
					onWheel={(e) => {
						const r = box.current!.getBoundingClientRect();
						zoomAt(Math.exp(-e.deltaY * 0.0015), e.clientX - r.left, e.clientY - r.top);
					}}
					data-testid="mark-canvas"
				>
					{view && (
						<Stage width={size.w} height={size.h} onPointerDown={(e) => pointer(e, 'down')} onPointerMove={(e) => pointer(e, 'move')} onPointerUp={(e) => pointer(e, 'up')} onPointerCancel={() => run({ type: 'cancel' })}>
							<Layer x={-view.x * view.scale} y={-view.y * view.scale} scaleX={view.scale} scaleY={view.scale} listening={false}>
								<TileImage src={photo.urls.display} x={0} y={0} width={photo.width} height={photo.height} />
								{tiles.map((t) => (
									<TileImage key={t.path} src={`${base}/${t.path}`} x={t.region.x} y={t.region.y} width={t.region.w} height={t.region.h} />
								))}
							</Layer>
							<Layer x={-view.x * view.scale} y={-view.y * view.scale} scaleX={view.scale} scaleY={view.scale} listening={false}>
								<AllMarks marks={visibleMarks.filter((m) => !previewMarks.has(m.id))} view={view} box={size} photo={photo} />
								{visibleMarks
									.filter((m) => selected.includes(m.id) && !previewMarks.has(m.id))
									.map((m) => (
										<MarkShape key={m.id} mark={m} zoom={view.scale} selected />
									))}
								{tool.state.preview && <PreviewShape preview={tool.state.preview} zoom={view.scale} />}
								{editable && selected.length === 1 && !tool.state.preview && <Handles mark={layer.marks.find((m) => m.id === selected[0])} zoom={view.scale} />}
							</Layer>
						</Stage>
					)}
				</div>
				<p className="text-xs text-ink-500">
					Wheel or + / − to zoom · Space-drag or middle-drag to move · 0 to fit{view ? ` · ${Math.round(view.scale * 100)} %` : ''} · full resolution {photo.width.toLocaleString('en-GB')} × {photo.height.toLocaleString('en-GB')} px
				</p>
			</div>
			<MarkSidebar
				photoId={photo.id}
				layer={layer}
				terms={terms}
				editable={editable}
				commenting={answer.mode === 'comment'}
				userId={userId}
				damage={damage}
				onDamage={setDamage}
				level={level}
				onLevel={setLevel}
				scaleMm={scaleMm}
				onScaleMm={setScaleMm}
				selected={selected}
				onSelect={selectIds}
				hidden={hidden}
				onHidden={setHidden}
				onPatch={patchSelected}
				onComment={(next) => commitLayer(next)}
			/>
		</div>
	);
}

/** The vertex handles of the one selected mark: drag one to move that point, Alt-click to add or remove. */
function Handles({ mark, zoom }: { mark: MarkLayer['marks'][number] | undefined; zoom: number }) {
	if (!mark) return null;
	const s = 7 / zoom;
	return (
		<>
			{handles(mark).map(([x, y], i) => (
				<Rect key={i} x={x - s / 2} y={y - s / 2} width={s} height={s} fill="#ffffff" stroke="#000000" strokeWidth={1.5 / zoom} listening={false} />
			))}
		</>
	);
}

function SyncBadge({ state, message, mode, reason }: { state: string; message: string | null; mode: LayerMode; reason: string | null }) {
	if (mode === 'read') return <p className="notice-info" data-testid="sync-state">Read-only. {reason}</p>;
	const label: Record<string, string> = { saved: 'All marks saved', unsaved: 'Changes not saved yet…', saving: 'Saving…', offline: 'Offline: kept in this browser', conflict: 'Not saved: someone else saved first', error: 'Not saved' };
	return (
		<p className={`text-sm ${state === 'saved' ? 'text-glass-700' : state === 'saving' || state === 'unsaved' ? 'text-ink-600' : 'text-alert-700'}`} role="status" data-testid="sync-state" data-state={state}>
			{label[state]}
			{state === 'error' && message ? ` — ${message}` : ''}
		</p>
	);
}
