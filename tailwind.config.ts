import type { Config } from 'tailwindcss';

// Rillstone's own palette: still water, wet stone, lichen and a warm copper accent.
// Every text colour used on `paper` or `mist` keeps WCAG AA contrast (4.5:1 or more).
export default {
	content: ['./src/**/*.{html,js,svelte,ts,md}', './content/**/*.md'],
	theme: {
		extend: {
			colors: {
				paper: '#fbf8f2',
				mist: '#eef2f0',
				ink: { DEFAULT: '#1d2421', soft: '#3f4a45', faint: '#5b6661' },
				pool: {
					50: '#eef6f6',
					100: '#d3e8e8',
					200: '#a9d1d2',
					400: '#4f9597',
					600: '#226669',
					700: '#1b5356',
					800: '#164346',
					900: '#0f3032'
				},
				lichen: { 100: '#e6ecd9', 500: '#6b7f45', 700: '#4b5a2f' },
				ember: { 100: '#f6e2d3', 500: '#b55d2a', 600: '#9c4c1f', 700: '#7d3c17' },
				signal: {
					warn: '#8a5a00',
					warnbg: '#fff4d6',
					bad: '#a1261d',
					badbg: '#fde8e6',
					good: '#2f6b2f',
					goodbg: '#e5f3e2'
				}
			},
			fontFamily: {
				display: ['Fraunces', 'Georgia', 'serif'],
				sans: ['"Source Sans 3"', 'system-ui', 'sans-serif']
			},
			fontSize: {
				'step--1': ['0.875rem', { lineHeight: '1.35rem' }],
				'step-0': ['1rem', { lineHeight: '1.6rem' }],
				'step-1': ['1.25rem', { lineHeight: '1.8rem' }],
				'step-2': ['1.563rem', { lineHeight: '2.1rem' }],
				'step-3': ['1.953rem', { lineHeight: '2.4rem' }],
				'step-4': ['2.441rem', { lineHeight: '2.8rem' }],
				'step-5': ['3.052rem', { lineHeight: '3.3rem' }]
			},
			spacing: { gutter: '1.25rem', section: '4.5rem' },
			borderRadius: { stone: '0.6rem' },
			maxWidth: { prose: '68ch', page: '76rem' }
		}
	}
} satisfies Config;
