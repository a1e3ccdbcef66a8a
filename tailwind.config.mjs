/**
 * Meniscus's own visual identity. Colours are named for what they evoke in a spirit store (glass,
 * aged spirit, label paper, ink) rather than for hues, so the code reads as the product does.
 * Contrast: every text colour below is used on `paper` or `white` and meets WCAG 2.2 AA (4.5:1)
 * for body text; `spirit-600` on white is for large text and borders only.
 * @type {import('tailwindcss').Config}
 */
export default {
	content: ['./src/**/*.{astro,html,ts,tsx,md}'],
	theme: {
		extend: {
			colors: {
				ink: {
					50: '#f3f6f6',
					100: '#e2e8e9',
					200: '#c5d1d3',
					300: '#9badb1',
					400: '#6e858a',
					500: '#52696e',
					600: '#3f5458',
					700: '#324347',
					800: '#243235',
					900: '#172124',
				},
				glass: {
					50: '#eef7f6',
					100: '#d3ebe8',
					200: '#a7d6d1',
					300: '#72bab4',
					400: '#469c97',
					500: '#2e807c',
					600: '#236763',
					700: '#1d5350',
					800: '#194341',
					900: '#143634',
				},
				spirit: {
					50: '#fdf8ec',
					100: '#f9ecc9',
					200: '#f2d78f',
					300: '#e9bd55',
					400: '#dea42f',
					500: '#c6871d',
					600: '#a66816',
					700: '#854d16',
					800: '#6d3f18',
					900: '#5b3518',
				},
				paper: '#faf8f3',
				alert: { 50: '#fdf1f0', 600: '#b3261e', 700: '#8f1d17' },
			},
			fontFamily: {
				sans: ['"Figtree Variable"', 'system-ui', 'sans-serif'],
				serif: ['"Source Serif 4 Variable"', 'Georgia', 'serif'],
			},
			// Touch targets of at least 44 px for tablets used with gloves in a store room.
			minHeight: { touch: '2.75rem' },
			minWidth: { touch: '2.75rem' },
		},
	},
	plugins: [],
};
