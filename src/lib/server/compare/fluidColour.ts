import { fluidColourSummary, meanColourInBox, meanColourInPolygon, type FluidColour, type RegionMean } from '../../colour/index.ts';
import { polygonArea } from '../../marks/geometry.ts';
import type { Mark, MarkLayer } from '../../marks/schema.ts';
import type { FluidColourAnswer } from '../../compare/view.ts';
import { readRgb } from '../photos/pipeline.ts';
import { resolveStored } from '../photos/storage.ts';
import { comparablePhotos, type Comparable } from './comparable.ts';
import { CompareError } from './error.ts';

/**
 * The colour of the fluid in one photograph, measured on its display copy: the mean inside the
 * largest fluid outline or box, white-balanced on the layer's grey reference (src/lib/colour).
 * Without a fluid mark, the clear fluid above the specimen between two level lines is used.
 * The marks are in full-resolution photo pixels, so they are scaled to the display copy. Computed
 * on each request (about 20 ms for a 1600 × 2000 demo photograph, most of it decoding the JPEG): nothing to
 * keep in step when marks or derivatives change.
 */
export const NO_FLUID_MARK = 'Outline the fluid (part Fluid), or draw the fluid line and the specimen’s top, on this photograph to measure its colour.';
export const UNREADABLE = 'The display copy of this photograph could not be read, so its fluid colour was not measured; an administrator has been told.';

type FluidMark = Extract<Mark, { kind: 'outline' | 'box' }>;
type Grey = Extract<Mark, { kind: 'grey' }>;
type Level = Extract<Mark, { kind: 'level' }>;
/** Where the fluid is sampled: a mark's outline or box, or a band of clear fluid (photo px). */
export type FluidRegion = { kind: 'outline'; points: [number, number][]; from: string } | (Pick<Extract<Mark, { kind: 'box' }>, 'x' | 'y' | 'w' | 'h'> & { kind: 'box'; from: string });

const areaOf = (m: FluidMark) => (m.kind === 'box' ? m.w * m.h : polygonArea(m.points));

/**
 * Without a fluid mark, the clear fluid between the fluid line and the specimen's top, when both are
 * drawn and the specimen is under the surface: the middle of that band (20–80 % along the lines, 25–75 %
 * of the way down), which keeps clear of the glass edges, the meniscus and the specimen.
 */
function clearFluidBand(layer: MarkLayer): FluidRegion | null {
	const level = (which: Level['level']) => layer.marks.find((m): m is Level => m.kind === 'level' && m.level === which);
	const f = level('fluid-line');
	const s = level('specimen-top');
	if (!f || !s) return null;
	const mid = (l: Level) => (l.from[1] + l.to[1]) / 2;
	// Image y grows downwards: the specimen's top must be lower in the picture than the surface.
	if (mid(s) - mid(f) < 8) return null;
	const along = (l: Level, t: number): [number, number] => [l.from[0] + (l.to[0] - l.from[0]) * t, l.from[1] + (l.to[1] - l.from[1]) * t];
	const at = (t: number, d: number): [number, number] => {
		const a = along(f, t);
		const b = along(s, t);
		return [a[0] + (b[0] - a[0]) * d, a[1] + (b[1] - a[1]) * d];
	};
	return { kind: 'outline', points: [at(0.2, 0.25), at(0.8, 0.25), at(0.8, 0.75), at(0.2, 0.75)], from: 'the clear fluid between the fluid line and the specimen’s top' };
}

/** The largest fluid outline or box (else the clear-fluid band), and the first grey reference, of a layer. */
export function fluidRegions(layer: MarkLayer): { fluid: FluidRegion | null; grey: Grey | null } {
	const regions = layer.marks.filter((m): m is FluidMark => (m.kind === 'outline' || m.kind === 'box') && m.part === 'fluid');
	const best = regions.reduce<FluidMark | null>((b, m) => (b && areaOf(b) >= areaOf(m) ? b : m), null);
	const fluid: FluidRegion | null = best
		? best.kind === 'box'
			? { kind: 'box', x: best.x, y: best.y, w: best.w, h: best.h, from: `the fluid mark “${best.term}”` }
			: { kind: 'outline', points: best.points, from: `the fluid mark “${best.term}”` }
		: clearFluidBand(layer);
	const grey = layer.marks.find((m): m is Grey => m.kind === 'grey') ?? null;
	return { fluid, grey };
}

/** Measures a photograph already loaded for a comparison. */
export async function measureFluidColour(c: Comparable): Promise<FluidColourAnswer> {
	const { fluid, grey } = fluidRegions(c.layer);
	if (!fluid) return { problem: NO_FLUID_MARK };
	let image: Awaited<ReturnType<typeof readRgb>>;
	try {
		image = await readRgb(resolveStored(c.display.path));
	} catch (err) {
		console.error(`fluid colour: display copy of photo ${c.photo.id} unreadable:`, (err as Error).message);
		return { problem: UNREADABLE };
	}
	const { data, width, height, channels } = image;
	const scale = width / c.photo.width;
	const mean = (m: FluidRegion | Grey): RegionMean =>
		m.kind === 'outline' ? meanColourInPolygon(data, width, height, channels, m.points, scale) : meanColourInBox(data, width, height, channels, { x: m.x, y: m.y, w: m.w, h: m.h }, scale);
	try {
		return { ...(fluidColourSummary(mean(fluid), grey ? mean(grey) : null) satisfies FluidColour), measuredIn: fluid.from };
	} catch (err) {
		// A fluid region with no usable pixels has no colour; the message says why.
		if (err instanceof RangeError) return { problem: err.message };
		throw err;
	}
}

/** GET /api/photos/[id]/fluid-colour. */
export async function fluidColourOf(photoId: string): Promise<FluidColourAnswer> {
	const [c] = await comparablePhotos({ id: photoId });
	if (!c) throw new CompareError(404, 'No such photograph, or it is still being processed.');
	return measureFluidColour(c);
}
