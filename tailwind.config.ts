import type { Config } from 'tailwindcss';

// Hopline's visual identity lives here and nowhere else: a deep teal ink on warm paper,
// amber for the electron (accent), rust and teal for oxidised and reduced levels.
export default {
	content: ['./src/**/*.{html,js,svelte,ts}'],
	theme: {
		extend: {
			colors: {
				ink: { DEFAULT: '#12343b', soft: '#3d5a60', faint: '#586f73' },
				paper: { DEFAULT: '#fbfaf6', deep: '#f1eee4', line: '#ddd8c8' },
				spark: { DEFAULT: '#f2b33d', deep: '#b9801a', pale: '#fdf1d6' },
				oxidised: '#a14a25',
				reduced: '#237080',
				caution: { DEFAULT: '#8a4b08', pale: '#fff4e0' },
				danger: { DEFAULT: '#9b1c1c', pale: '#fdecec' },
				// The distance matrix's scale, near to far edge-to-edge (catalogue/distanceMatrix.ts).
				reach: { 1: '#0d4a57', 2: '#2c7a80', 3: '#8bbcb0', 4: '#e3dcc0', 5: '#f6f3ea' }
			},
			fontFamily: {
				sans: ['"Noto Sans"', 'system-ui', 'sans-serif'],
				mono: ['ui-monospace', 'SFMono-Regular', 'Menlo', 'monospace']
			},
			fontSize: {
				xs: ['0.75rem', '1.1rem'],
				sm: ['0.875rem', '1.35rem'],
				base: ['1rem', '1.6rem'],
				lg: ['1.2rem', '1.75rem'],
				xl: ['1.5rem', '2rem'],
				'2xl': ['2rem', '2.5rem']
			}
		}
	}
} satisfies Config;
