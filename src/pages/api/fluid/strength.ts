import { calculator } from '../../../lib/server/fluid/calculator.ts';
import { StrengthInput } from '../../../lib/fluid/schema.ts';
import { correctStrength } from '../../../lib/fluid/alcoholometry.ts';

/** Real strength at 20 °C from an alcohol-meter reading and the sample's temperature. */
export const POST = calculator(StrengthInput, (i) => correctStrength(i.readingPercentVol, i.tempC, i.glass));
