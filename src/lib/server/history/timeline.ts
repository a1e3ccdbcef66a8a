import { buildTimeline } from '../../history/timeline.ts';
import { TimelineSchema, type Timeline } from '../../history/schema.ts';
import { checksOfSpecimen } from '../checks/service.ts';
import { getSpecimen } from '../specimens/service.ts';
import { comparablePhotos } from '../compare/comparable.ts';
import { measureFluidColour } from '../compare/fluidColour.ts';

/** A specimen's visual history for GET /api/specimens/[id]/timeline; null when there is no such specimen. */
export async function specimenTimeline(id: string, now = new Date()): Promise<Timeline | null> {
	const specimen = await getSpecimen(id);
	if (!specimen) return null;
	return TimelineSchema.parse(buildTimeline(specimen, await checksOfSpecimen(id), now.toISOString().slice(0, 10), await yellownessByCheck(id)));
}

/**
 * The fluid's yellowness at each check, from the first front photograph of that check whose colour
 * can be measured and was white-balanced on a grey card (about 20 ms a photograph: measured on the
 * display copy, src/lib/server/compare/fluidColour.ts). Unreliable readings are left out of the
 * series rather than drawn beside reliable ones.
 */
async function yellownessByCheck(specimenId: string): Promise<Map<string, number>> {
	const photos = (await comparablePhotos({ specimenId })).filter((c) => c.check && c.photo.view === 'front');
	const out = new Map<string, number>();
	for (const c of photos) {
		if (out.has(c.check!.id)) continue;
		const colour = await measureFluidColour(c);
		if ('yellowness' in colour && colour.reliable) out.set(c.check!.id, Math.round(colour.yellowness * 100) / 100);
	}
	return out;
}
