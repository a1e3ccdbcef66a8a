import { calculator } from '../../../lib/server/fluid/calculator.ts';
import { TopUpInput } from '../../../lib/fluid/schema.ts';
import { topUp } from '../../../lib/fluid/mixing.ts';

/** What to add to a jar's remaining fluid to restore level and strength, or why adding cannot. */
export const POST = calculator(TopUpInput, topUp);
