import { useEffect, useMemo, useRef, useState } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api, ApiError } from '../../lib/client/api.ts';
import type { Role } from '../../lib/auth/roles.ts';
import { analysePair } from '../../lib/compare/analysis.ts';
import { pairsFromControlMarks } from '../../lib/compare/pairs.ts';
import { lowestUnused } from '../../lib/marks/tools/measure.ts';
import { MAX_PAIRS, type ControlPair, type RegistrationModel } from '../../lib/compare/schema.ts';
import type { MarkChange } from '../../lib/compare/changes.ts';
import { QueryRoot } from '../QueryRoot.tsx';
import { ComparePane, type PaneImage } from './ComparePane.tsx';
import { ChangePanel } from './ChangePanel.tsx';
import { DecisionPanel } from './DecisionPanel.tsx';
import { RegistrationPanel } from './RegistrationPanel.tsx';
import { drawChanges, drawControlPoints } from './drawOverlay.ts';
import { usePanZoom } from './usePanZoom.ts';
import { useLoadedImage } from './useLoadedImage.ts';
import { warpToBefore } from './warp.ts';
import { dateOf, photoLabel, type FluidColourAnswer, type SavedComparison, type SourcePhoto, type Sources } from './types.ts';

/**
 * Two photographs of one specimen, compared: placed control points line them up (a perspective or
 * affine fit, with its errors), then side by side with linked pan and zoom, a swipe, or an overlay,
 * with the change between their mark layers drawn and listed, and the fluid's level and colour. A
 * comparison can be saved and reopened; a reviewer can decide on the later check from here.
 */
interface Props {
	/** Empty when a saved comparison is opened: its own specimen is used. */
	specimenId: string;
	userId: string;
	role: Role;
	comparisonId?: string;
	before?: string;
	after?: string;
}

export default function CompareWorkspace(props: Props) {
	return (
		<QueryRoot>
			<Loader {...props} />
		</QueryRoot>
	);
}

function Loader(props: Props) {
	const saved = useQuery({
		queryKey: ['comparison', props.comparisonId],
		enabled: !!props.comparisonId,
		queryFn: () => api<{ comparison: SavedComparison }>(`/api/comparisons/${props.comparisonId}`),
	});
	const specimenId = props.specimenId || saved.data?.comparison.specimenId;
	const sources = useQuery({ queryKey: ['comparison-sources', specimenId], enabled: !!specimenId, queryFn: () => api<Sources>(`/api/specimens/${specimenId}/comparison-sources`) });
	const failed = sources.error ?? saved.error;
	if (failed) return <p className="notice-error" role="alert">{failed.message}</p>;
	if (!specimenId || !sources.data || (props.comparisonId && !saved.data)) return <p role="status">Loading the photographs…</p>;
	if (sources.data.photos.length < 2) return <p className="notice-info">This specimen has fewer than two photographs ready: there is nothing to compare yet.</p>;
	return <Workspace {...props} specimenId={specimenId} sources={sources.data} saved={saved.data?.comparison ?? null} />;
}

type Mode = 'points' | 'side' | 'swipe' | 'overlay';
const MODES: { id: Mode; label: string; key: string }[] = [
	{ id: 'points', label: 'Match points', key: '1' },
	{ id: 'side', label: 'Side by side', key: '2' },
	{ id: 'swipe', label: 'Swipe', key: '3' },
	{ id: 'overlay', label: 'Overlay', key: '4' },
];

/** The default pair: the newest photo, and the newest of the same view from an earlier date. */
function defaultPair(photos: SourcePhoto[]): [string, string] {
	const after = photos[0]!;
	const before = photos.find((p) => p.id !== after.id && p.view === after.view && dateOf(p) < dateOf(after)) ?? photos.find((p) => p.id !== after.id)!;
	return [before.id, after.id];
}

type Pending = { n: number; before?: readonly [number, number]; after?: readonly [number, number] };

function Workspace({ specimenId, userId, role, sources, saved, before: askBefore, after: askAfter }: Props & { sources: Sources; saved: SavedComparison | null }) {
	const photos = sources.photos;
	const known = (id: string | undefined) => (id && photos.some((p) => p.id === id) ? id : undefined);
	const [ids, setIds] = useState<[string, string]>(() => {
		if (saved) return [saved.beforePhotoId, saved.afterPhotoId];
		const [b, a] = defaultPair(photos);
		return [known(askBefore) ?? b, known(askAfter) ?? a];
	});
	const before = photos.find((p) => p.id === ids[0])!;
	const after = photos.find((p) => p.id === ids[1])!;
	const [pairs, setPairs] = useState<ControlPair[]>(saved?.controlPoints ?? []);
	const [pending, setPending] = useState<Pending | null>(null);
	const [model, setModel] = useState<RegistrationModel>(saved?.model ?? 'perspective');
	const [mode, setMode] = useState<Mode>(saved && saved.controlPoints.length ? 'swipe' : 'points');
	const [note, setNote] = useState(saved?.note ?? '');
	const [current, setCurrent] = useState<{ id: string; version: number } | null>(saved ? { id: saved.id, version: saved.version } : null);
	const [divider, setDivider] = useState(0.5);
	const [opacity, setOpacity] = useState(0.5);
	const [showChanges, setShowChanges] = useState(true);
	const [showUnchanged, setShowUnchanged] = useState(false);

	const colourOf = (p: SourcePhoto) => ({
		queryKey: ['fluid-colour', p.id, p.layer.version],
		queryFn: () => api<{ colour: FluidColourAnswer }>(`/api/photos/${p.id}/fluid-colour`).then((r) => r.colour),
	});
	const colourBefore = useQuery(colourOf(before));
	const colourAfter = useQuery(colourOf(after));

	const analysis = useMemo(
		() =>
			analysePair(
				{ width: before.width, height: before.height, layer: before.layer.layer, date: dateOf(before), levelMm: before.check?.levelMm ?? null },
				{ width: after.width, height: after.height, layer: after.layer.layer, date: dateOf(after), levelMm: after.check?.levelMm ?? null },
				model,
				pairs,
				{ before: colourBefore.data ?? null, after: colourAfter.data ?? null },
			),
		[before, after, model, pairs, colourBefore.data, colourAfter.data],
	);
	const transform = analysis.registration.transform;
	const markedPairs = useMemo(() => pairsFromControlMarks(before.layer.layer, after.layer.layer).length, [before, after]);

	// Layout: the panes share the width of their row.
	const row = useRef<HTMLDivElement>(null);
	const [rowW, setRowW] = useState(900);
	useEffect(() => {
		const el = row.current;
		if (!el) return;
		const ro = new ResizeObserver(([e]) => e && setRowW(Math.max(320, e.contentRect.width)));
		ro.observe(el);
		return () => ro.disconnect();
	}, []);
	const two = mode === 'points' || mode === 'side';
	const paneSize = { w: two ? Math.floor((rowW - 12) / 2) : rowW, h: Math.round(Math.min(640, Math.max(360, rowW * (two ? 0.55 : 0.6)))) };
	const frame = { width: before.width, height: before.height };
	const shared = usePanZoom(paneSize, frame);
	const afterView = usePanZoom(paneSize, { width: after.width, height: after.height });

	const beforeImg = useLoadedImage(before.urls.display);
	const afterImg = useLoadedImage(after.urls.display);
	const warped = useMemo(() => {
		if (!afterImg || !transform) return null;
		return warpToBefore(
			afterImg,
			{ photoWidth: after.width, displayWidth: after.display.width, displayHeight: after.display.height },
			{ photoWidth: before.width, displayWidth: before.display.width, displayHeight: before.display.height },
			transform,
		);
	}, [afterImg, transform, after, before]);

	const showChange = (c: MarkChange) => showChanges && (showUnchanged || c.change !== 'unchanged');
	const changesOverlay = (c: CanvasRenderingContext2D, v: Parameters<typeof drawChanges>[3]) => drawChanges(c, analysis.changes.changes, transform, v, showChange);
	const flagged = new Set((analysis.registration.residuals?.bad ?? []).flatMap((b) => (b.n === null ? [] : [b.n])));

	const place = (side: 'before' | 'after', at: [number, number]) => {
		if (pairs.length >= MAX_PAIRS) return;
		const p: Pending = pending ?? { n: lowestUnused(pairs.map((x) => x.n)) };
		const next = { ...p, [side]: at };
		if (next.before && next.after) {
			setPairs((ps) => [...ps, { n: next.n, before: [next.before![0], next.before![1]], after: [next.after![0], next.after![1]] }]);
			setPending(null);
		} else setPending(next);
	};

	const qc = useQueryClient();
	const save = useMutation({
		mutationFn: async () => {
			const comparison = { beforePhotoId: before.id, afterPhotoId: after.id, model: analysis.registration.transform ? model : 'none', controlPoints: pairs, note };
			if (current) return api<{ comparison: SavedComparison }>(`/api/comparisons/${current.id}`, { method: 'PUT', body: { version: current.version, comparison } });
			return api<{ comparison: SavedComparison }>(`/api/specimens/${specimenId}/comparisons`, { method: 'POST', body: comparison });
		},
		onSuccess: ({ comparison }) => {
			setCurrent({ id: comparison.id, version: comparison.version });
			void qc.invalidateQueries({ queryKey: ['comparisons', specimenId] });
			if (!location.pathname.startsWith('/comparisons/')) history.replaceState(null, '', `/comparisons/${comparison.id}`);
		},
	});

	const choose = (which: 0 | 1, id: string) => {
		const next: [string, string] = which === 0 ? [id, ids[1]] : [ids[0], id];
		if (next[0] === next[1]) return;
		setIds(next);
		setPairs([]);
		setPending(null);
	};

	const afterImage = (extra: Partial<PaneImage>): PaneImage | null =>
		warped ? { key: 'after-warped', image: warped, width: before.width, height: before.height, ...extra } : afterImg ? { key: 'after', image: afterImg, width: after.width, height: after.height, ...extra } : null;
	const beforeImage: PaneImage | null = beforeImg ? { key: 'before', image: beforeImg, width: before.width, height: before.height } : null;
	const list = (...xs: (PaneImage | null)[]) => xs.filter((x): x is PaneImage => x !== null);

	const onKeys = (e: React.KeyboardEvent) => {
		if ((e.target as HTMLElement).closest('input, select, textarea, button')) return;
		const m = MODES.find((x) => x.key === e.key);
		if (m) {
			setMode(m.id);
			e.preventDefault();
		} else if (e.key === 'Escape' && pending) setPending(null);
	};
	const canSave = role === 'conservator' || role === 'reviewer';
	const decide = role === 'reviewer' && after.check?.status === 'in-review';

	return (
		<div className="grid gap-4 xl:grid-cols-[1fr_22rem]" onKeyDown={onKeys}>
			<div className="space-y-3">
				<div className="flex flex-wrap items-end gap-3">
					{(['Earlier', 'Later'] as const).map((label, i) => (
						<label key={label} className="text-sm">
							<span className="field-label">{label} photograph</span>
							<select className="field-input" value={ids[i]} onChange={(e) => choose(i as 0 | 1, e.target.value)} data-testid={i ? 'after-photo' : 'before-photo'}>
								{photos.map((p) => (
									<option key={p.id} value={p.id} disabled={p.id === ids[1 - i]}>
										{photoLabel(p)}
									</option>
								))}
							</select>
						</label>
					))}
					<button type="button" className="btn-secondary" onClick={() => (setIds([ids[1], ids[0]]), setPairs(pairs.map((p) => ({ n: p.n, before: p.after, after: p.before }))), setPending(null))}>
						Swap
					</button>
				</div>
				<div role="tablist" aria-label="View" className="flex flex-wrap gap-1">
					{MODES.map((m) => (
						<button key={m.id} type="button" role="tab" aria-selected={mode === m.id} className={mode === m.id ? 'btn-primary' : 'btn-secondary'} onClick={() => setMode(m.id)} data-testid={`mode-${m.id}`}>
							<kbd className="mr-1 text-xs opacity-70">{m.key}</kbd>
							{m.label}
						</button>
					))}
				</div>
				{!analysis.aligned && mode !== 'points' && (
					<p className="notice-caution text-sm" data-testid="unaligned">
						Not lined up: {analysis.registration.problem ?? 'compared as photographed.'} Place control points in Match points to line the photographs up.
					</p>
				)}
				<div ref={row} className={two ? 'flex gap-3' : ''}>
					{mode === 'points' && (
						<>
							<ComparePane label={`Earlier · ${dateOf(before)}`} testId="pane-before" size={paneSize} pz={shared} images={list(beforeImage)} onClick={(at) => place('before', at)}
								overlay={(c, v) => drawControlPoints(c, [...pairs.map((p) => ({ n: p.n, at: p.before })), ...(pending?.before ? [{ n: pending.n, at: pending.before }] : [])], v, flagged, pending?.n ?? null)} />
							<ComparePane label={`Later · ${dateOf(after)}`} testId="pane-after" size={paneSize} pz={afterView} images={list(afterImg && { key: 'after', image: afterImg, width: after.width, height: after.height })} onClick={(at) => place('after', at)}
								overlay={(c, v) => drawControlPoints(c, [...pairs.map((p) => ({ n: p.n, at: p.after })), ...(pending?.after ? [{ n: pending.n, at: pending.after }] : [])], v, flagged, pending?.n ?? null)} />
						</>
					)}
					{mode === 'side' && (
						<>
							<ComparePane label={`Earlier · ${dateOf(before)}`} testId="pane-before" size={paneSize} pz={shared} images={list(beforeImage)} overlay={changesOverlay} />
							<ComparePane label={`Later · ${dateOf(after)}${analysis.aligned ? ' · lined up' : ''}`} testId="pane-after" size={paneSize} pz={shared} images={list(afterImage({}))} overlay={changesOverlay} />
						</>
					)}
					{mode === 'swipe' && (
						<ComparePane label={`Earlier ${dateOf(before)} | later ${dateOf(after)}`} testId="pane-swipe" size={paneSize} pz={shared} images={list(beforeImage, afterImage({ fromScreenX: divider * paneSize.w }))} overlay={changesOverlay}>
							<Divider at={divider} onAt={setDivider} height={paneSize.h} />
						</ComparePane>
					)}
					{mode === 'overlay' && (
						<ComparePane label={`Earlier ${dateOf(before)} under later ${dateOf(after)}`} testId="pane-overlay" size={paneSize} pz={shared} images={list(beforeImage, afterImage({ opacity }))} overlay={changesOverlay} />
					)}
				</div>
				<div className="flex flex-wrap items-center gap-4 text-sm">
					{mode === 'overlay' && (
						<label className="flex items-center gap-2">
							Later photograph's opacity
							<input type="range" min={0} max={1} step={0.05} value={opacity} onChange={(e) => setOpacity(Number(e.target.value))} aria-valuetext={`${Math.round(opacity * 100)} %`} />
						</label>
					)}
					{mode !== 'points' && (
						<>
							<label className="flex items-center gap-2">
								<input type="checkbox" checked={showChanges} onChange={(e) => setShowChanges(e.target.checked)} /> Show changes on the photos
							</label>
							<label className="flex items-center gap-2">
								<input type="checkbox" checked={showUnchanged} onChange={(e) => setShowUnchanged(e.target.checked)} disabled={!showChanges} /> and unchanged marks
							</label>
						</>
					)}
					<span className="text-xs text-ink-600">Wheel or + / − to zoom · drag or arrow keys to move · 0 to fit · 1–4 switch views{mode === 'points' ? ' · click to place a point, Esc to drop a half-placed pair' : ''}</span>
				</div>
			</div>
			<div className="space-y-4">
				<RegistrationPanel
					model={model}
					onModel={setModel}
					pairs={pairs}
					pending={pending}
					registration={analysis.registration}
					markedPairs={markedPairs}
					onUseMarked={() => (setPairs(pairsFromControlMarks(before.layer.layer, after.layer.layer).slice(0, MAX_PAIRS).map((p) => ({ n: p.n ?? 0, before: [p.from[0], p.from[1]], after: [p.to[0], p.to[1]] }))), setPending(null))}
					onRemove={(n) => setPairs((ps) => ps.filter((p) => p.n !== n))}
					onClear={() => (setPairs([]), setPending(null))}
				/>
				<ChangePanel analysis={analysis} />
				{canSave && (
					<section className="card space-y-2" aria-labelledby="save-heading">
						<h2 id="save-heading" className="text-lg">Keep this comparison</h2>
						<label className="block text-sm">
							<span className="field-label">Note</span>
							<textarea className="field-input w-full" rows={2} value={note} onChange={(e) => setNote(e.target.value)} maxLength={4000} />
						</label>
						{save.error && <p className="notice-error">{save.error instanceof ApiError ? save.error.message : 'Not saved.'}</p>}
						{save.isSuccess && !save.isPending && <p className="notice-info" role="status" data-testid="saved">Saved. It can be reopened from the specimen's page.</p>}
						<button type="button" className="btn-primary" disabled={save.isPending} onClick={() => save.mutate()} data-testid="save-comparison">
							{current ? 'Save changes' : 'Save comparison'}
						</button>
					</section>
				)}
				{decide && <DecisionPanel photo={after} userId={userId} />}
			</div>
		</div>
	);
}

/** The swipe's divider: drag it, or focus it and use the arrow keys (Home and End go to the edges). */
function Divider({ at, onAt, height }: { at: number; onAt: (v: number) => void; height: number }) {
	const drag = useRef(false);
	const move = (e: React.PointerEvent<HTMLDivElement>) => {
		if (!drag.current) return;
		const r = (e.currentTarget.parentElement as HTMLElement).getBoundingClientRect();
		onAt(Math.min(1, Math.max(0, (e.clientX - r.left) / r.width)));
		e.stopPropagation();
	};
	return (
		<div
			role="slider"
			tabIndex={0}
			aria-label="Swipe divider: earlier photograph on the left, later on the right"
			aria-valuemin={0}
			aria-valuemax={100}
			aria-valuenow={Math.round(at * 100)}
			data-testid="swipe-divider"
			className="absolute top-0 z-10 w-6 -translate-x-1/2 cursor-ew-resize touch-none focus-visible:outline-glass-600"
			style={{ left: `${at * 100}%`, height }}
			onPointerDown={(e) => {
				drag.current = true;
				e.currentTarget.setPointerCapture(e.pointerId);
				e.stopPropagation();
			}}
			onPointerMove={move}
			onPointerUp={(e) => {
				drag.current = false;
				e.stopPropagation();
			}}
			onKeyDown={(e) => {
				const step = e.shiftKey ? 0.1 : 0.02;
				const to = e.key === 'ArrowLeft' ? at - step : e.key === 'ArrowRight' ? at + step : e.key === 'Home' ? 0 : e.key === 'End' ? 1 : null;
				if (to === null) return;
				onAt(Math.min(1, Math.max(0, to)));
				e.preventDefault();
				e.stopPropagation();
			}}
		>
			<div className="mx-auto h-full w-1 bg-white shadow-[0_0_0_1px_#000]" />
			<div className="absolute left-1/2 top-1/2 h-10 w-6 -translate-x-1/2 -translate-y-1/2 rounded border-2 border-black bg-white" aria-hidden="true" />
		</div>
	);
}
