/**
 * The risk matrix of a treatment's risk assessment: likelihood × severity, each 1–5, rating their
 * product (1–25). The five words per axis and the four bands are common practice in workplace
 * risk assessment (no single published source; organisations set their own): 1–4 low, 5–9
 * medium, 10–16 high, 20–25 very high. A reviewer cannot sign off an assessment with a residual
 * rating in the very-high band: the work should not go ahead as planned.
 */
export const LEVELS = [1, 2, 3, 4, 5] as const;
export type Level = (typeof LEVELS)[number];

export const LIKELIHOOD_LABELS: Record<Level, string> = { 1: 'Rare', 2: 'Unlikely', 3: 'Possible', 4: 'Likely', 5: 'Almost certain' };
export const SEVERITY_LABELS: Record<Level, string> = { 1: 'Negligible', 2: 'Minor', 3: 'Moderate', 4: 'Major', 5: 'Severe' };

export const BANDS = ['low', 'medium', 'high', 'very-high'] as const;
export type Band = (typeof BANDS)[number];
export const BAND_LABELS: Record<Band, string> = { low: 'Low', medium: 'Medium', high: 'High', 'very-high': 'Very high' };

export interface Rating {
	likelihood: Level;
	severity: Level;
}

export function score(r: Rating): number {
	return r.likelihood * r.severity;
}

export function band(scoreValue: number): Band {
	if (!Number.isInteger(scoreValue) || scoreValue < 1 || scoreValue > 25) throw new RangeError('A rating is a whole number from 1 to 25.');
	if (scoreValue <= 4) return 'low';
	if (scoreValue <= 9) return 'medium';
	if (scoreValue <= 16) return 'high';
	return 'very-high';
}

export const bandOf = (r: Rating): Band => band(score(r));

/** Bands in order, for "the worst of" and for refusing a residual that is worse than the risk before controls. */
export const bandRank = (b: Band): number => BANDS.indexOf(b);

export function worstBand(ratings: readonly Rating[]): Band | null {
	let worst: Band | null = null;
	for (const r of ratings) {
		const b = bandOf(r);
		if (worst === null || bandRank(b) > bandRank(worst)) worst = b;
	}
	return worst;
}
