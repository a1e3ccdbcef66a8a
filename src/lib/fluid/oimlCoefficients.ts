/**
 * The coefficients of the general formula of OIML R 22 (1975), International Alcoholometric Tables
 * (also in the Annex of Council Directive 76/766/EEC): the density of ethanol–water mixtures as a
 * function of ethanol mass fraction p and temperature t,
 *
 *   ρ(p, t) = A₁ + Σ_{k=2..12} A_k p^(k−1) + Σ_{k=1..6} B_k (t−20)^k + Σ_{i=1..5} Σ_{k=1..m_i} C_{i,k} p^k (t−20)^i
 *
 * in kg/m³, valid for −20…+40 °C. A test compares every value with the published reference copy
 * (shared/reference/oiml-r22.json).
 */
export const A: readonly number[] = [
	998.20123, -192.9769495, 389.1238958, -1668.103923, 13522.15441, -88292.78388, 306287.4042, -613838.1234,
	747017.2998, -547846.1354, 223446.0334, -39032.85426,
];

export const B: readonly number[] = [
	-0.20618513, -0.0052682542, 3.6130013e-5, -3.8957702e-7, 7.169354e-9, -9.9739231e-11,
];

/** C[i−1][k−1] = C_{i,k}; row i has m_i = 11, 10, 9, 4, 2 terms. */
export const C: readonly (readonly number[])[] = [
	[
		0.1693443461530087, -10.46914743455169, 71.96353469546523, -704.7478054272792, 3924.090430035045,
		-12101.64659068747, 22486.46550400788, -26055.62982188164, 18523.73922069467, -7420.201433430137,
		1285.617841998974,
	],
	[
		-0.0119301300505701, 0.2517399633803461, -2.170575700536993, 13.53034988843029, -50.29988758547014,
		109.635566657757, -142.2753946421155, 108.043594285623, -44.14153236817392, 7.442971530188783,
	],
	[
		-0.0006802995733503803, 0.01876837790289664, -0.2002561813734156, 1.02299296671922, -2.895696483903638,
		4.810060584300675, -4.672147440794683, 2.458043105903461, -0.5411227621436812,
	],
	[4.075376675622027e-6, -8.76305857347111e-6, 6.515031360099368e-6, -1.51578483698721e-6],
	[-2.788074354782409e-8, 1.345612883493354e-8],
];

/** The formula's validity in temperature (Directive 76/766/EEC Annex, section 4). */
export const T_MIN_C = -20;
export const T_MAX_C = 40;

/** Cubic expansion coefficients of alcoholometer glass used by the OIML tables (per K). */
export const GLASS_EXPANSION_PER_K = { 'soda-lime': 25e-6, borosilicate: 10e-6 } as const;
export type MeterGlass = keyof typeof GLASS_EXPANSION_PER_K;
