/**
 * How far the fluid fell between two checks: from the level lines marked on each photograph (the
 * fluid line and the jar's inner base, each photograph with its own scale), or from the levels
 * recorded in mm at each check. Where a mark or a reading is missing the answer is null with the
 * reason, for the page to show instead of a number.
 */
import { DAYS_PER_YEAR } from '../fluid/trend.ts';
import { mmPerPixel } from '../marks/measure.ts';
import type { Level, Mark, MarkLayer } from '../marks/schema.ts';

export type LevelHeight = { heightPx: number; heightMm: number; reason: null } | { heightPx: number | null; heightMm: null; reason: string };

type LevelMark = Extract<Mark, { kind: 'level' }>;

/** The one level line of this kind, or why there is none to use. */
function one(layer: Pick<MarkLayer, 'marks'>, level: Level, name: string): LevelMark | string {
	const found = layer.marks.filter((m): m is LevelMark => m.kind === 'level' && m.level === level);
	if (found.length === 0) return `No ${name} is marked on this photograph.`;
	if (found.length > 1) return `${found.length} ${name}s are marked on this photograph; keep one.`;
	return found[0]!;
}

/**
 * The fluid's height above the inner base: the distance from the middle of the fluid line to the
 * inner-base line, measured at right angles to that line (not straight down the photograph), so a
 * photograph taken slightly askew gives the same height. In px, and in mm with the photograph's
 * scale (`mmPerPx`, by default from its scale bar). The inner-base line must run across the
 * photograph (within 45° of level): "above" is the side of it towards the top of the photograph.
 */
export function levelHeight(layer: MarkLayer, mmPerPx: number | null = mmPerPixel(layer)): LevelHeight {
	const fluid = one(layer, 'fluid-line', 'fluid line');
	const base = one(layer, 'inner-base', 'inner-base line');
	if (typeof fluid === 'string') return { heightPx: null, heightMm: null, reason: fluid };
	if (typeof base === 'string') return { heightPx: null, heightMm: null, reason: base };
	const dx = base.to[0] - base.from[0];
	const dy = base.to[1] - base.from[1];
	const len = Math.hypot(dx, dy);
	if (!(len > 0)) return { heightPx: null, heightMm: null, reason: 'The inner-base line has no length; draw it across the jar.' };
	if (Math.abs(dy) > Math.abs(dx)) return { heightPx: null, heightMm: null, reason: 'The inner-base line runs up the photograph; draw it across the jar at the bottom of the fluid.' };
	// The unit normal to the base that points up the photograph (y grows downwards).
	const nx = (dx > 0 ? dy : -dy) / len;
	const ny = (dx > 0 ? -dx : dx) / len;
	const mx = (fluid.from[0] + fluid.to[0]) / 2;
	const my = (fluid.from[1] + fluid.to[1]) / 2;
	const heightPx = (mx - base.from[0]) * nx + (my - base.from[1]) * ny;
	if (!(heightPx > 0)) return { heightPx: null, heightMm: null, reason: 'The fluid line is drawn at or below the inner base; check the two level lines.' };
	if (mmPerPx === null) return { heightPx, heightMm: null, reason: 'This photograph has no scale bar, so the level cannot be given in mm.' };
	if (!(Number.isFinite(mmPerPx) && mmPerPx > 0)) throw new RangeError('The scale must be a positive number of mm per px.');
	return { heightPx, heightMm: heightPx * mmPerPx, reason: null };
}

export type LevelChange =
	| {
			beforeMm: number;
			afterMm: number;
			/** after − before, mm: negative when the level fell. */
			changeMm: number;
			days: number;
			/** mm lost per year (positive when falling); null when both are from the same day. */
			lossMmPerYear: number | null;
			reason: null;
	  }
	| { changeMm: null; reason: string };

const DAY_MS = 86_400_000;

function day(date: string, which: string): number {
	const t = Date.parse(/^\d{4}-\d{2}-\d{2}$/.test(date) ? `${date}T00:00:00Z` : date);
	if (!Number.isFinite(t)) throw new RangeError(`The ${which} date “${date}” is not a date (YYYY-MM-DD).`);
	return t / DAY_MS;
}

/** The change between two levels in mm on two dates (ISO), and the loss per year. */
export function levelChange(beforeMm: number, afterMm: number, beforeDate: string, afterDate: string): LevelChange {
	if (![beforeMm, afterMm].every((v) => Number.isFinite(v) && v >= 0)) throw new RangeError('A fluid level is a number of mm, 0 or more.');
	const days = day(afterDate, 'later') - day(beforeDate, 'earlier');
	if (days < 0) throw new RangeError('The later check is dated before the earlier one; swap them.');
	const changeMm = afterMm - beforeMm;
	return { beforeMm, afterMm, changeMm, days, lossMmPerYear: days > 0 ? -changeMm / (days / DAYS_PER_YEAR) : null, reason: null };
}

export interface DatedLayer {
	layer: MarkLayer;
	/** The date the photograph was taken or the check made, YYYY-MM-DD or an ISO date-time. */
	date: string;
	/** mm per px; by default from the layer's scale bar. */
	mmPerPx?: number | null;
}

/** The level change from the level lines on two photographs, each measured with its own scale. */
export function fluidLevelChange(before: DatedLayer, after: DatedLayer): LevelChange {
	// An absent mmPerPx leaves levelHeight's default, the layer's scale bar.
	const b = levelHeight(before.layer, before.mmPerPx);
	const a = levelHeight(after.layer, after.mmPerPx);
	if (b.reason !== null) return { changeMm: null, reason: `Earlier photograph: ${b.reason}` };
	if (a.reason !== null) return { changeMm: null, reason: `Later photograph: ${a.reason}` };
	return levelChange(b.heightMm, a.heightMm, before.date, after.date);
}

/** The level change from the levels recorded at two checks (FluidReading.levelMm). */
export function fluidLevelChangeFromReadings(before: { levelMm: number | null; date: string }, after: { levelMm: number | null; date: string }): LevelChange {
	if (before.levelMm === null) return { changeMm: null, reason: 'No fluid level was recorded at the earlier check.' };
	if (after.levelMm === null) return { changeMm: null, reason: 'No fluid level was recorded at the later check.' };
	return levelChange(before.levelMm, after.levelMm, before.date, after.date);
}
