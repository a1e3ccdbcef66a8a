import type { APIRoute } from 'astro';
import { z } from 'zod';
import { json, problem } from '../../../../lib/server/http.ts';
import { specimenTimeline } from '../../../../lib/server/history/timeline.ts';

/** A specimen's history over its checks: grades, fluid readings, and the level and strength trends. */
export const GET: APIRoute = async ({ params }) => {
	const id = z.uuid().safeParse(params.id);
	const timeline = id.success ? await specimenTimeline(id.data) : null;
	if (!timeline) return problem(404, 'No such specimen.');
	return json(timeline);
};
