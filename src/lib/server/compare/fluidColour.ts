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
 * The marks are in full-resolution photo pixels, so they are scaled to the display copy. Computed
 * on each request (about 20 ms for a 1600 × 2000 demo photograph, most of it decoding the JPEG): nothing to
 * keep in step when marks or derivatives change.
 */
export const NO_FLUID_MARK = 'Outline the fluid (part Fluid) on this photograph to measure its colour.';
export const UNREADABLE = 'The display copy of this photograph could not be read, so its fluid colour was not measured; an administrator has been told.';

type FluidRegion = Extract<Mark, { kind: 'outline' | 'box' }>;
type Grey = Extract<Mark, { kind: 'grey' }>;

const areaOf = (m: FluidRegion) => (m.kind === 'box' ? m.w * m.h : polygonArea(m.points));

/** The largest fluid outline or box, and the first grey reference, of a layer. */
export function fluidRegions(layer: MarkLayer): { fluid: FluidRegion | null; grey: Grey | null } {
	const regions = layer.marks.filter((m): m is FluidRegion => (m.kind === 'outline' || m.kind === 'box') && m.part === 'fluid');
	const fluid = regions.reduce<FluidRegion | null>((best, m) => (best && areaOf(best) >= areaOf(m) ? best : m), null);
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
		m.kind === 'outline' ? meanColourInPolygon(data, width, height, channels, m.points, scale) : meanColourInBox(data, width, height, channels, m, scale);
	try {
		return fluidColourSummary(mean(fluid), grey ? mean(grey) : null) satisfies FluidColour;
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
