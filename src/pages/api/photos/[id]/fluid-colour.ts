import type { APIRoute } from 'astro';
import { z } from 'zod';
import { problem } from '../../../../lib/server/http.ts';
import { fluidColourOf } from '../../../../lib/server/compare/fluidColour.ts';
import { answer } from '../../../../lib/server/compare/route.ts';

/**
 * The fluid colour of a photograph, measured on its display copy from its fluid and grey marks as
 * they are now: { colour }, a FluidColour or { problem } saying what to mark (ready for analysePair).
 */
export const GET: APIRoute = async ({ params }) => {
	const id = z.uuid().safeParse(params.id);
	if (!id.success) return problem(404, 'No such photograph.');
	return answer(async () => ({ colour: await fluidColourOf(id.data) }));
};
