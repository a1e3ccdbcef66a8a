import { z } from 'zod';

/**
 * What the fluid calculators accept, shared by the forms and the API. Types and shapes are checked
 * here; the ranges of validity are checked by the computations themselves, which explain them.
 */
const num = (what: string) => z.number({ error: `${what}: enter a number.` }).refine(Number.isFinite, `${what}: enter a finite number.`);

export const StrengthInput = z
	.object({
		readingPercentVol: num('Reading'),
		tempC: num('Temperature'),
		glass: z.enum(['soda-lime', 'borosilicate']).default('soda-lime'),
	})
	.strict();

export const DiluteInput = z
	.object({ stockPercentVol: num('Stock strength'), targetPercentVol: num('Target strength'), targetVolumeMl: num('Volume') })
	.strict();

export const WaterInput = z
	.object({ fromPercentVol: num('Present strength'), toPercentVol: num('Wanted strength'), volumeMl: num('Volume') })
	.strict();

export const TopUpInput = z
	.object({
		currentVolumeMl: num('Fluid left'),
		currentPercentVol: num('Present strength'),
		targetVolumeMl: num('Full volume'),
		targetPercentVol: num('Target strength'),
		stockPercentVol: num('Stock strength'),
	})
	.strict();

export const JarInput = z
	.object({
		shape: z.enum(['cylinder', 'oval', 'rectangular'], { error: 'Choose cylinder, oval or rectangular.' }),
		widthMm: num('Width'),
		depthMm: num('Depth').nullable().optional(),
		heightMm: num('Height'),
	})
	.strict();

export const JarVolumeInput = z
	.object({ jar: JarInput, levelMm: num('Fluid level').nullable().optional(), displacementMl: num('Displacement').default(0) })
	.strict();

export const AirspaceInput = z
	.object({
		jar: JarInput,
		material: z.enum(['soda-lime', 'borosilicate', 'acrylic'], { error: 'Choose the jar material.' }),
		percentVol: num('Strength'),
		fillTempC: num('Filling temperature'),
		maxTempC: num('Warmest temperature'),
		displacementMl: num('Displacement').default(0),
	})
	.strict();

export const TrendInput = z
	.object({
		points: z
			.array(z.object({ date: z.iso.date({ error: 'Dates are written YYYY-MM-DD.' }), value: num('Value') }).strict())
			.max(500, 'At most 500 readings.'),
		unit: z.enum(['mm', '% vol']).default('mm'),
		lineMm: num('Line').nullable().optional(),
		mlPerMm: num('mL per mm').positive().nullable().optional(),
	})
	.strict();
