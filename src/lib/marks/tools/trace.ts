import { simplify, simplifyClosed, validOutline } from '../geometry.ts';
import { MAX_VERTICES_PER_MARK, type Point } from '../schema.ts';
import { toleranceOf } from './events.ts';
import type { DraftMark, ToolStateBase } from './effects.ts';
import { defineTool, distance, near, result } from './common.ts';

/**
 * Trace: freehand. Press, draw, release. The stroke is thinned as it comes in (pointer events
 * arrive far denser than anyone can draw) and simplified on release, so a stored mark has tens of
 * points, not thousands. Ending near the start, or holding Alt, closes it into an outline when the
 * shape is a simple polygon; otherwise it is kept as a line and the reason shown.
 */
export interface TraceState extends ToolStateBase {
	stroke: Point[] | null;
	alt: boolean;
}

/** Consecutive samples closer than this share of the tolerance add nothing a person meant. */
const SAMPLE_SPACING = 0.25;
/**
 * Simplification keeps every sample within this share of the tolerance, so with the thinning the
 * mark stays within the tolerance of what was drawn (¼ + ½ < 1) while still dropping most points.
 */
const SIMPLIFY_SHARE = 0.5;
/** A stroke longer than this (samples) stops growing: a pointer stuck down must not eat memory. */
const MAX_SAMPLES = MAX_VERTICES_PER_MARK * 4;

const initial = (): TraceState => ({ stroke: null, alt: false, preview: null, message: null });

function preview(s: TraceState, tol: number): TraceState {
	const st = s.stroke;
	if (!st) return { ...s, preview: null };
	const closes = st.length >= 3 && (s.alt || near(st[st.length - 1]!, st[0]!, tol));
	return { ...s, preview: { kind: 'polyline', points: st, rubber: null, closed: false, closes } };
}

/** The mark a finished stroke makes, or why it makes none (null: a jitter, not a stroke). */
function finish(stroke: Point[], alt: boolean, tol: number): { mark: DraftMark; message: string | null } | { mark: null; message: string | null } {
	const start = stroke[0]!;
	// A stroke that never leaves the tolerance of its start is a click with a shaky hand.
	if (stroke.every((p) => near(p, start, tol))) return { mark: null, message: null };
	let note: string | null = null;
	if (alt || near(stroke[stroke.length - 1]!, start, tol)) {
		const ring = simplifyClosed(stroke, tol * SIMPLIFY_SHARE);
		const check = validOutline(ring);
		if (check.ok && ring.length <= MAX_VERTICES_PER_MARK) return { mark: { kind: 'outline', points: ring }, message: null };
		note = check.ok ? null : `${check.reason} It was kept as a line.`;
	}
	const line = simplify(stroke, tol * SIMPLIFY_SHARE);
	if (line.length > MAX_VERTICES_PER_MARK) return { mark: null, message: `That stroke is too detailed to keep (over ${MAX_VERTICES_PER_MARK.toLocaleString('en-GB')} points); zoom out and trace it again.` };
	return { mark: { kind: 'path', points: line }, message: note };
}

export const traceTool = defineTool<TraceState>(
	{ id: 'trace', label: 'Trace', key: 't', hint: 'Draw freehand. End where you started (or hold Alt) to close it into an outline.' },
	initial,
	(s, e, ctx) => {
		const tol = toleranceOf(e, ctx);
		if (e.type === 'down') return result(preview({ ...s, stroke: [e.at], alt: !!e.alt, message: null }, tol));
		if ((e.type !== 'move' && e.type !== 'up') || !s.stroke) return result(s);
		const last = s.stroke[s.stroke.length - 1]!;
		const keep = distance(last, e.at) >= tol * SAMPLE_SPACING && s.stroke.length < MAX_SAMPLES;
		const stroke = keep ? [...s.stroke, e.at] : s.stroke;
		const alt = s.alt || !!e.alt;
		if (e.type === 'move') return result(preview({ ...s, stroke, alt }, tol));
		const done = finish(stroke, alt, tol);
		return result({ ...initial(), message: done.message }, done.mark ? [{ kind: 'commit', mark: done.mark }] : []);
	},
	{ dropOnEscape: true },
);
