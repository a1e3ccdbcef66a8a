import { z } from 'zod';

/**
 * A storage location as the API shows it, and the limits an administrator sets on it: the store's
 * flammable volume limit (the organisation's own figure from its local fire code), the share of it
 * that counts as near, and the expected temperature range. Temperatures stay within −20…+40 °C, the
 * range of the OIML R 22 formula the airspace check uses.
 */
export const LocationViewSchema = z.object({
	id: z.uuid(),
	code: z.string(),
	name: z.string(),
	notes: z.string(),
	flammableLimitL: z.number().nullable(),
	nearLimitPercent: z.number(),
	tempMinC: z.number().nullable(),
	tempMaxC: z.number().nullable(),
});
export type LocationView = z.infer<typeof LocationViewSchema>;

const temperature = (what: string) =>
	z
		.number({ error: `${what}: enter a temperature in °C.` })
		.min(-20, `${what}: between −20 and +40 °C, the range the airspace check can judge.`)
		.max(40, `${what}: between −20 and +40 °C, the range the airspace check can judge.`)
		.nullable();

export const LocationLimitsSchema = z
	.object({
		flammableLimitL: z
			.number({ error: 'Flammable limit: enter litres, or leave it empty for no limit.' })
			// Kept to 0.1 L and above 0 (DECIMAL(9,1) with a check): less would round to no limit at all.
			.min(0.1, 'Flammable limit: at least 0.1 litres (limits are kept to 0.1 L), or leave it empty for no limit.')
			.max(1_000_000, 'Flammable limit: at most 1,000,000 litres.')
			.nullable(),
		nearLimitPercent: z
			.number({ error: 'Near the limit at: enter a percentage.' })
			.int('Near the limit at: a whole percentage.')
			.min(1, 'Near the limit at: between 1 and 100 %.')
			.max(100, 'Near the limit at: between 1 and 100 %.'),
		tempMinC: temperature('Coolest'),
		tempMaxC: temperature('Warmest'),
	})
	.strict()
	.refine((l) => l.tempMinC === null || l.tempMaxC === null || l.tempMinC <= l.tempMaxC, {
		message: 'The coolest temperature cannot be above the warmest.',
		path: ['tempMinC'],
	});
export type LocationLimits = z.infer<typeof LocationLimitsSchema>;

/** A change to some of the limits; the server checks the result as a whole. */
export const LocationLimitsPatchSchema = z
	.object({
		flammableLimitL: z.unknown().optional(),
		nearLimitPercent: z.unknown().optional(),
		tempMinC: z.unknown().optional(),
		tempMaxC: z.unknown().optional(),
	})
	.strict();
