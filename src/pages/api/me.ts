import type { APIRoute } from 'astro';
import { json } from '../../lib/server/http.ts';

/** Who is signed in; the islands use it to show and hide what the role allows. */
export const GET: APIRoute = ({ locals }) => json({ user: locals.user });
