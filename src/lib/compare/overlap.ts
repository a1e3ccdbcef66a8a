/**
 * Damage marks as regions of the photograph, and how much two regions overlap (intersection over
 * union), so a mark on one photograph can be found again on another. Regions are polygon-clipping
 * multipolygons in photo px: outlines as drawn, boxes as their rectangles, lines widened to a band
 * and pins to a small disc, since a line or a point has no area to overlap.
 *
 * A mark is first reduced to a Shape (an area, a line or a point) and mapped through a transform
 * vertex by vertex: a homography carries straight edges to straight edges, so a mapped outline is
 * exact, and a box becomes a general quadrilateral. Lines and pins are widened only after mapping,
 * so a band or disc has the same width in the frame where marks are compared.
 */
import polygonClipping, { type MultiPolygon } from 'polygon-clipping';
import { bounds, polygonArea, polylineLength, type XY } from '../marks/geometry.ts';
import type { DamageMark } from '../marks/schema.ts';
import { applyHomography } from './registration.ts';

type P = [number, number];

export type Shape = { kind: 'area'; ring: P[] } | { kind: 'line'; points: P[] } | { kind: 'point'; at: P };
export type ShapeKind = Shape['kind'];

/**
 * A line stands for a band this wide, px: a crack drawn a few pixels to one side on the next
 * photograph, or registered a few pixels off, still overlaps itself (common practice, no published source).
 */
export const PATH_WIDTH_PX = 10;
/** A pin stands for a disc this size, px: damage marked by a point is taken to be about here (common practice, no published source). */
export const PIN_RADIUS_PX = 12;
/**
 * Discs are regular polygons of this many sides inscribed in the circle: 16 sides hold 97.4 % of the
 * circle's area (½·n·sin(2π/n) / π), enough for overlap and few vertices to clip.
 */
export const DISC_SIDES = 16;
/** The joins between a band's segments are coarser discs: they only fill the wedge between two rectangles. */
const JOIN_SIDES = 8;

export interface RegionOptions {
	pathWidthPx?: number;
	pinRadiusPx?: number;
}

const copy = (p: XY): P => [p[0], p[1]];

/** The mark's geometry in its own photo's pixels. */
export function markShape(mark: DamageMark): Shape {
	switch (mark.kind) {
		case 'outline':
			return { kind: 'area', ring: mark.points.map(copy) };
		case 'box':
			return { kind: 'area', ring: [[mark.x, mark.y], [mark.x + mark.w, mark.y], [mark.x + mark.w, mark.y + mark.h], [mark.x, mark.y + mark.h]] };
		case 'path':
			return { kind: 'line', points: mark.points.map(copy) };
		case 'pin':
			return { kind: 'point', at: copy(mark.at) };
	}
}

/** The shape carried through a transform (3 × 3 rows, see registration.ts), vertex by vertex. */
export function mapShape(h: readonly (readonly number[])[], shape: Shape): Shape {
	switch (shape.kind) {
		case 'area':
			return { kind: 'area', ring: shape.ring.map((p) => applyHomography(h, p)) };
		case 'line':
			return { kind: 'line', points: shape.points.map((p) => applyHomography(h, p)) };
		case 'point':
			return { kind: 'point', at: applyHomography(h, shape.at) };
	}
}

/** Area px² of an area shape, length px of a line, null for a point. */
export function shapeSize(shape: Shape): number | null {
	if (shape.kind === 'area') return polygonArea(shape.ring);
	if (shape.kind === 'line') return polylineLength(shape.points);
	return null;
}

/**
 * polygon-clipping 0.15 can fail ("Unable to complete output ring…", mfogel/polygon-clipping#91,
 * #105, #139, open) when two vertices are a rounding error apart, as a disc's vertex at cos(π/2)
 * ≈ 6·10⁻¹⁷ is from a rectangle's corner at 0. Every vertex it is given is first snapped to a grid
 * of 1/1024 px, far below what a mark means; should it still fail, the operation is repeated on
 * coarser grids (1/64, then 1/4 px) before the error is let through.
 */
const GRIDS = [1024, 64, 4];

const snapRing = (ring: readonly XY[], grid: number): P[] => ring.map((p) => [Math.round(p[0] * grid) / grid, Math.round(p[1] * grid) / grid]);
const snapRegion = (region: MultiPolygon, grid: number): MultiPolygon => region.map((polygon) => polygon.map((ring) => snapRing(ring, grid)));

function clip(op: 'union' | 'intersection', regions: readonly MultiPolygon[]): MultiPolygon {
	for (let k = 0; ; k++) {
		const snapped = regions.map((r) => snapRegion(r, GRIDS[k]!));
		try {
			return polygonClipping[op](snapped[0]!, ...snapped.slice(1));
		} catch (error) {
			if (k === GRIDS.length - 1) throw error;
		}
	}
}

function disc(c: XY, r: number, sides: number): MultiPolygon {
	const ring: P[] = [];
	for (let k = 0; k < sides; k++) ring.push([c[0] + r * Math.cos((2 * Math.PI * k) / sides), c[1] + r * Math.sin((2 * Math.PI * k) / sides)]);
	return [[ring]];
}

/**
 * A polyline widened to a band `width` px across: a rectangle along each segment and a disc at each
 * point (round joins and round ends), merged into one region. Its area is about length × width plus
 * one disc.
 */
export function band(points: readonly XY[], width: number): MultiPolygon {
	const r = width / 2;
	const pieces: MultiPolygon[] = points.map((p) => disc(p, r, JOIN_SIDES));
	for (let i = 1; i < points.length; i++) {
		const [ax, ay] = points[i - 1]!;
		const [bx, by] = points[i]!;
		const len = Math.hypot(bx - ax, by - ay);
		if (len === 0) continue;
		// The unit normal times r: the rectangle's half-width to either side of the segment.
		const nx = (-(by - ay) / len) * r;
		const ny = ((bx - ax) / len) * r;
		pieces.push([[[[ax + nx, ay + ny], [bx + nx, by + ny], [bx - nx, by - ny], [ax - nx, ay - ny]]]]);
	}
	return clip('union', pieces);
}

function checkWidth(v: number, what: string): number {
	if (!(Number.isFinite(v) && v > 0)) throw new RangeError(`${what} must be a positive number of pixels.`);
	return v;
}

/** The region a shape stands for, in the frame its coordinates are in. */
export function shapeRegion(shape: Shape, options: RegionOptions = {}): MultiPolygon {
	switch (shape.kind) {
		case 'area':
			return snapRegion([[shape.ring]], GRIDS[0]!);
		case 'line':
			return band(shape.points, checkWidth(options.pathWidthPx ?? PATH_WIDTH_PX, 'The width of a line'));
		case 'point':
			return snapRegion(disc(shape.at, checkWidth(options.pinRadiusPx ?? PIN_RADIUS_PX, 'The radius of a pin'), DISC_SIDES), GRIDS[0]!);
	}
}

/** A damage mark's region, mapped through `h` first when given. */
export function markRegion(mark: DamageMark, h?: readonly (readonly number[])[] | null, options: RegionOptions = {}): MultiPolygon {
	const shape = markShape(mark);
	return shapeRegion(h ? mapShape(h, shape) : shape, options);
}

/** Shoelace area of a multipolygon, px²: each polygon's outer ring less its holes. */
export function regionArea(region: MultiPolygon): number {
	let sum = 0;
	for (const [outer, ...holes] of region) {
		sum += polygonArea(outer ?? []);
		for (const hole of holes) sum -= polygonArea(hole);
	}
	return sum;
}

export interface Box {
	minX: number;
	minY: number;
	maxX: number;
	maxY: number;
}

/** The region's axis-aligned bounding box. */
export function regionBox(region: MultiPolygon): Box {
	const b = bounds(region.flatMap((polygon) => polygon[0] ?? []));
	return { minX: b.x, minY: b.y, maxX: b.x + b.w, maxY: b.y + b.h };
}

const apart = (a: Box, b: Box): boolean => a.maxX < b.minX || b.maxX < a.minX || a.maxY < b.minY || b.maxY < a.minY;

export function intersectionArea(a: MultiPolygon, b: MultiPolygon): number {
	if (apart(regionBox(a), regionBox(b))) return 0;
	return regionArea(clip('intersection', [a, b]));
}

export function unionArea(a: MultiPolygon, b: MultiPolygon): number {
	return regionArea(clip('union', [a, b]));
}

/**
 * Intersection over union (the Jaccard index of the two regions), 0 to 1. The union's area is
 * taken as |A| + |B| − |A ∩ B| rather than clipped again: equal for regions that do not overlap
 * themselves (outlines are refused when they cross themselves, bands are merged), at half the cost.
 */
export function iou(a: MultiPolygon, b: MultiPolygon): number {
	const inter = intersectionArea(a, b);
	if (inter === 0) return 0;
	const union = regionArea(a) + regionArea(b) - inter;
	return union > 0 ? Math.min(1, inter / union) : 0;
}
