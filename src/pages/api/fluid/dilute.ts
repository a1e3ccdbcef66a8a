import { calculator } from '../../../lib/server/fluid/calculator.ts';
import { DiluteInput } from '../../../lib/fluid/schema.ts';
import { dilute } from '../../../lib/fluid/mixing.ts';

/** Stock spirit and water for a target volume and strength, with the naive figures beside them. */
export const POST = calculator(DiluteInput, dilute);
