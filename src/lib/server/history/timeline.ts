import { buildTimeline } from '../../history/timeline.ts';
import { TimelineSchema, type Timeline } from '../../history/schema.ts';
import { checksOfSpecimen } from '../checks/service.ts';
import { getSpecimen } from '../specimens/service.ts';

/** A specimen's visual history for GET /api/specimens/[id]/timeline; null when there is no such specimen. */
export async function specimenTimeline(id: string, now = new Date()): Promise<Timeline | null> {
	const specimen = await getSpecimen(id);
	if (!specimen) return null;
	return TimelineSchema.parse(buildTimeline(specimen, await checksOfSpecimen(id), now.toISOString().slice(0, 10)));
}
