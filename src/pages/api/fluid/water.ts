import { calculator } from '../../../lib/server/fluid/calculator.ts';
import { WaterInput } from '../../../lib/fluid/schema.ts';
import { waterToAdd } from '../../../lib/fluid/mixing.ts';

/** Water to add to bring spirit down to a wanted strength, with the V1C1 = V2C2 figure beside it. */
export const POST = calculator(WaterInput, (i) => ({
	waterMl: waterToAdd(i),
	naiveWaterMl: (i.volumeMl * i.fromPercentVol) / i.toPercentVol - i.volumeMl,
}));
