import type { APIRoute } from 'astro';
import { json } from '../../lib/server/http.ts';
import { homeSummary } from '../../lib/server/home/summary.ts';

/** The figures for the signed-in user's home page. */
export const GET: APIRoute = async ({ locals }) => json(await homeSummary(locals.user!.role, locals.user!.id));
