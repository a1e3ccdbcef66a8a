import { derivativeRoute } from '../../../../lib/server/photos/derivativeRoute.ts';

/** The screen-sized copy (long edge 2048 px, upright, sRGB, no metadata). */
export const GET = derivativeRoute('display');
