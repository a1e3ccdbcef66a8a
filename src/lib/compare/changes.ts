/**
 * What changed between two condition checks of one jar, from their photographs' mark layers: each
 * damage mark of the later photograph is matched with the same damage on the earlier one, and each
 * is then new, resolved, grown, shrunk or unchanged.
 *
 * Frames. Everything is compared in the BEFORE photograph's pixels. `transform` maps AFTER-photo
 * pixels to BEFORE-photo pixels: `fitHomography(pairsFromControlMarks(after, before))`. Without it
 * the two photographs are taken to be framed alike (the identity).
 *
 * Matching. Two marks can be the same damage only if they are on the same part, with the same term,
 * and of the same sort of shape (areas, outlines and boxes alike; lines; pins). Among those, pairs
 * whose regions overlap by at least `minIoU` (intersection over union, overlap.ts) are matched
 * greedily, best overlap first, each mark at most once. Greedy is not the optimal assignment
 * (Hungarian) in every case, but it differs only when several marks of one term on one part overlap
 * each other ambiguously, and it keeps the cost near n log n. Candidate pairs come from a grid over
 * their bounding boxes (grid.ts), so marks far apart are never clipped against each other.
 *
 * Noise. A matched area or line has grown or shrunk only when its size changed by at least the
 * relative threshold of its earlier size AND by at least the absolute one in the basis unit;
 * anything less is unchanged. A matched pin is always unchanged: a point has no size.
 *
 * Sizes. When both photographs have a scale, sizes are compared in mm² (or mm), each mark measured
 * in its own photograph with that photograph's scale (measure.ts): the scale bars, not the fitted
 * transform, then carry the sizes, and a photograph taken closer in does not look like growth.
 * Otherwise sizes are compared in px² (or px) of the before photograph, the after mark mapped into
 * it. `basis` says which.
 */
import type { MultiPolygon } from 'polygon-clipping';
import type { Part } from '../check/vocabulary.ts';
import { markArea, markLength, mmPerPixel } from '../marks/measure.ts';
import { isDamage, type DamageMark, type MarkLayer } from '../marks/schema.ts';
import { overlappingPairs } from './grid.ts';
import { iou, mapShape, markShape, regionBox, shapeRegion, shapeSize, type Box, type RegionOptions, type Shape, type ShapeKind } from './overlap.ts';
import { checkMatrix3, type Matrix3 } from './registration.ts';

/**
 * A change smaller than this fraction of the earlier size is noise: the same damage outlined twice
 * by hand differs by several per cent (common practice, no published source).
 */
export const NOISE_RELATIVE = 0.1;
/** Nor is a change of less than 1 mm² an observation (common practice, no published source). */
export const NOISE_ABS_MM2 = 1;
/** Without scales, the least area change that counts, before-photo px² (a 10 × 10 px patch; common practice, no published source). */
export const NOISE_ABS_PX2 = 100;
/** The least length change of a line that counts, mm (common practice, no published source). */
export const NOISE_ABS_MM = 0.5;
/** Without scales, the least length change of a line that counts, before-photo px (common practice, no published source). */
export const NOISE_ABS_PX = 5;
/**
 * The least overlap (intersection over union) for two marks to be one damage. Low, because damage
 * that grew threefold overlaps its earlier outline by only 1/3 (common practice, no published source).
 */
export const MATCH_MIN_IOU = 0.1;
/** How many of the largest changes the summary lists. */
export const SUMMARY_BIGGEST = 5;

export type ChangeClass = 'new' | 'resolved' | 'grown' | 'shrunk' | 'unchanged';
export const CHANGE_CLASSES = ['new', 'resolved', 'grown', 'shrunk', 'unchanged'] as const satisfies readonly ChangeClass[];

export interface NoiseThreshold {
	relative: number;
	absMm2: number;
	absPx2: number;
	absMm: number;
	absPx: number;
}

export interface CompareOptions extends RegionOptions {
	/** Maps AFTER-photo px to BEFORE-photo px (3 × 3 rows); the identity when absent. */
	transform?: Matrix3 | null;
	/** mm per px of each photograph; each defaults to mmPerPixel of its layer, null means no scale. */
	mmPerPx?: { before?: number | null; after?: number | null };
	noiseThreshold?: Partial<NoiseThreshold>;
	minIoU?: number;
}

/** A size before and after; `change` is after − before, an absent side counting as 0 (new, resolved). */
export interface Sizes {
	before: number | null;
	after: number | null;
	change: number;
}

export interface MarkChange {
	change: ChangeClass;
	part: Part;
	term: string;
	shape: ShapeKind;
	before: DamageMark | null;
	after: DamageMark | null;
	/** Overlap of the matched marks' regions in the before frame; null when one side is absent. */
	iou: number | null;
	/** Areas (areas only), px² of the before photograph. */
	areaPx2: Sizes | null;
	/** Areas in mm², each in its own photograph; only when both photographs have a scale. */
	areaMm2: Sizes | null;
	/** Lengths (lines only), px of the before photograph. */
	lengthPx: Sizes | null;
	lengthMm: Sizes | null;
	/** (after − before) / before in the basis unit, for matched areas and lines; else null. */
	relative: number | null;
}

export interface Basis {
	area: 'mm²' | 'px²';
	length: 'mm' | 'px';
}

export interface ChangeSummary {
	counts: Record<ChangeClass, number>;
	/** The largest area changes (new and resolved included), largest |change| in the basis unit first. */
	biggestArea: MarkChange[];
	/** The largest length changes of lines, likewise. */
	biggestLength: MarkChange[];
}

export interface Comparison {
	changes: MarkChange[];
	summary: ChangeSummary;
	basis: Basis;
	thresholds: NoiseThreshold & { minIoU: number };
}

interface Side {
	mark: DamageMark;
	shape: Shape;
	box: Box;
	/** Area px² or length px in the before frame; null for pins. */
	size: number | null;
	/** The same in the mark's own photograph, for the mm figures. */
	ownSize: number | null;
	key: string;
	region: MultiPolygon;
}

function scaleOf(given: number | null | undefined, layer: MarkLayer, which: string): number | null {
	if (given === undefined) return mmPerPixel(layer);
	if (given === null) return null;
	if (!(Number.isFinite(given) && given > 0)) throw new RangeError(`The ${which} photograph’s scale must be a positive number of mm per px.`);
	return given;
}

function checkThreshold(t: NoiseThreshold & { minIoU: number }): void {
	for (const [name, v] of Object.entries(t)) if (!(Number.isFinite(v) && v >= 0)) throw new RangeError(`The threshold ${name} must be a number, 0 or more.`);
	if (t.minIoU <= 0 || t.minIoU > 1) throw new RangeError('The least overlap for a match (minIoU) must be above 0 and at most 1.');
}

function prepare(mark: DamageMark, h: Matrix3 | null, options: RegionOptions): Side {
	const own = markShape(mark);
	const shape = h ? mapShape(h, own) : own;
	const region = shapeRegion(shape, options);
	return {
		mark,
		shape,
		box: regionBox(region),
		size: shapeSize(shape),
		ownSize: shape.kind === 'area' ? markArea(mark) : shape.kind === 'line' ? markLength(mark) : null,
		key: `${mark.part}\u0000${mark.term}\u0000${shape.kind}`,
		region,
	};
}

/** Matched pairs [before index, after index, IoU], best first, each side used once. */
function match(before: readonly Side[], after: readonly Side[], minIoU: number): [number, number, number][] {
	const candidates: [number, number, number][] = [];
	for (const [i, j] of overlappingPairs(before.map((s) => s.box), after.map((s) => s.box))) {
		if (before[i]!.key !== after[j]!.key) continue;
		const o = iou(before[i]!.region, after[j]!.region);
		if (o >= minIoU) candidates.push([i, j, o]);
	}
	candidates.sort((p, q) => q[2] - p[2] || p[0] - q[0] || p[1] - q[1]);
	const usedB = new Uint8Array(before.length);
	const usedA = new Uint8Array(after.length);
	const matched: [number, number, number][] = [];
	for (const c of candidates) {
		if (usedB[c[0]] || usedA[c[1]]) continue;
		usedB[c[0]] = 1;
		usedA[c[1]] = 1;
		matched.push(c);
	}
	return matched;
}

const sizes = (before: number | null | undefined, after: number | null | undefined): Sizes => ({
	before: before ?? null,
	after: after ?? null,
	change: (after ?? 0) - (before ?? 0),
});

/**
 * Compares two mark layers of one jar (see the file's comment for frames, matching and sizes).
 * Measurement marks are ignored. Bad options are a RangeError.
 */
export function compareMarkLayers(before: MarkLayer, after: MarkLayer, options: CompareOptions = {}): Comparison {
	const h = options.transform ?? null;
	if (h) checkMatrix3(h);
	const kBefore = scaleOf(options.mmPerPx?.before, before, 'before');
	const kAfter = scaleOf(options.mmPerPx?.after, after, 'after');
	const scaled = kBefore !== null && kAfter !== null;
	const thresholds = {
		relative: NOISE_RELATIVE,
		absMm2: NOISE_ABS_MM2,
		absPx2: NOISE_ABS_PX2,
		absMm: NOISE_ABS_MM,
		absPx: NOISE_ABS_PX,
		...options.noiseThreshold,
		minIoU: options.minIoU ?? MATCH_MIN_IOU,
	};
	checkThreshold(thresholds);
	const region = { pathWidthPx: options.pathWidthPx, pinRadiusPx: options.pinRadiusPx };
	const b = before.marks.filter(isDamage).map((m) => prepare(m, null, region));
	const a = after.marks.filter(isDamage).map((m) => prepare(m, h, region));

	const changeOf = (x: Side | null, y: Side | null, o: number | null): MarkChange => {
		const one = (x ?? y)!;
		const isArea = one.shape.kind === 'area';
		const isLine = one.shape.kind === 'line';
		const px = sizes(x?.size, y?.size);
		// Areas scale with the square of the linear scale.
		const inMm = (side: Side | null, k: number) => (side && side.ownSize !== null ? side.ownSize * (isArea ? k * k : k) : null);
		const mm = scaled ? sizes(inMm(x, kBefore), inMm(y, kAfter)) : null;
		const basis = mm ?? px;
		let change: ChangeClass = !x ? 'new' : !y ? 'resolved' : 'unchanged';
		let relative: number | null = null;
		if (x && y && (isArea || isLine)) {
			relative = basis.change / basis.before!;
			const floor = isArea ? (scaled ? thresholds.absMm2 : thresholds.absPx2) : scaled ? thresholds.absMm : thresholds.absPx;
			if (Math.abs(basis.change) >= floor && Math.abs(relative) >= thresholds.relative) change = basis.change > 0 ? 'grown' : 'shrunk';
		}
		return {
			change,
			part: one.mark.part,
			term: one.mark.term,
			shape: one.shape.kind,
			before: x?.mark ?? null,
			after: y?.mark ?? null,
			iou: o,
			areaPx2: isArea ? px : null,
			areaMm2: isArea ? mm : null,
			lengthPx: isLine ? px : null,
			lengthMm: isLine ? mm : null,
			relative,
		};
	};

	const pairs = match(b, a, thresholds.minIoU);
	const partner = new Map(pairs.map(([i, j, o]) => [i, [j, o] as const]));
	const taken = new Set(pairs.map((p) => p[1]));
	const changes = [
		...b.map((x, i) => {
			const p = partner.get(i);
			return changeOf(x, p ? a[p[0]]! : null, p ? p[1] : null);
		}),
		...a.flatMap((y, j) => (taken.has(j) ? [] : [changeOf(null, y, null)])),
	];
	return { changes, summary: summarise(changes), basis: scaled ? { area: 'mm²', length: 'mm' } : { area: 'px²', length: 'px' }, thresholds };
}

/** Counts per class and the largest changes, in the comparison's basis unit. */
export function summarise(changes: readonly MarkChange[]): ChangeSummary {
	const counts = Object.fromEntries(CHANGE_CLASSES.map((c) => [c, 0])) as Record<ChangeClass, number>;
	for (const c of changes) counts[c.change]++;
	const biggest = (measure: (c: MarkChange) => Sizes | null) =>
		changes
			.filter((c) => c.change !== 'unchanged' && measure(c))
			.sort((p, q) => Math.abs(measure(q)!.change) - Math.abs(measure(p)!.change))
			.slice(0, SUMMARY_BIGGEST);
	return { counts, biggestArea: biggest((c) => c.areaMm2 ?? c.areaPx2), biggestLength: biggest((c) => c.lengthMm ?? c.lengthPx) };
}
