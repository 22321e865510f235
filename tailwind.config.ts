import type { Config } from 'tailwindcss';

// Kappaline's palette. Phase colours come from the Okabe–Ito colour-blind-safe set:
// gas phase = blue, solid state = vermillion. Every use also carries a text label.
export default {
	content: ['./src/**/*.{html,js,svelte,ts}'],
	theme: {
		extend: {
			colors: {
				ink: { DEFAULT: '#1d2530', soft: '#4a5565', faint: '#7a8594' },
				paper: { DEFAULT: '#fbfaf7', raised: '#ffffff', sunk: '#f1efe9' },
				line: '#dcd8cf',
				accent: { DEFAULT: '#2f5d50', soft: '#e3ede9' },
				gas: { DEFAULT: '#0072b2', soft: '#e0eef7' },
				solid: { DEFAULT: '#d55e00', soft: '#fbe9dc' },
				warn: { DEFAULT: '#8a5a00', soft: '#fdf3d8' },
				danger: { DEFAULT: '#a3261b', soft: '#f9e1de' }
			},
			fontFamily: {
				sans: ['"IBM Plex Sans"', 'system-ui', 'sans-serif'],
				mono: ['"JetBrains Mono"', 'ui-monospace', 'monospace']
			}
		}
	},
	plugins: []
} satisfies Config;
