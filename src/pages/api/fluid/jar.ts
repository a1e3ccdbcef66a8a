import { calculator } from '../../../lib/server/fluid/calculator.ts';
import { JarVolumeInput } from '../../../lib/fluid/schema.ts';
import { fluidVolumeMl, innerVolumeMl, mlPerMm } from '../../../lib/fluid/jar.ts';

/** A jar's inner volume, mL per mm of level, and the fluid volume at a level. */
export const POST = calculator(JarVolumeInput, (i) => ({
	innerVolumeMl: innerVolumeMl(i.jar),
	mlPerMm: mlPerMm(i.jar),
	fluidVolumeMl: i.levelMm === null || i.levelMm === undefined ? null : fluidVolumeMl(i.jar, i.levelMm, i.displacementMl),
}));
