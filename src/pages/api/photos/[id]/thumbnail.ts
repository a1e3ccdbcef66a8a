import { derivativeRoute } from '../../../../lib/server/photos/derivativeRoute.ts';

/** The small copy shown in lists and on check pages (long edge 400 px, no metadata). */
export const GET = derivativeRoute('thumbnail');
