import { calculator } from '../../../lib/server/fluid/calculator.ts';
import { AirspaceInput } from '../../../lib/fluid/schema.ts';
import { airspace } from '../../../lib/fluid/airspace.ts';

/** The least headspace that keeps the fluid off the lid at the warmest expected temperature. */
export const POST = calculator(AirspaceInput, airspace);
