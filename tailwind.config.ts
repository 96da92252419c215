import type { Config } from 'tailwindcss';

/**
 * Causeway's own design tokens. Colours are CSS variables (see src/app.css) so the high-contrast
 * mode for the bay can swap them without a second set of classes.
 */
const token = (name: string) => `rgb(var(--cw-${name}) / <alpha-value>)`;

export default {
	content: ['./src/**/*.{html,svelte,ts}'],
	theme: {
		extend: {
			colors: {
				paper: token('paper'),
				panel: token('panel'),
				ink: token('ink'),
				muted: token('muted'),
				line: token('line'),
				tide: { DEFAULT: token('tide'), strong: token('tide-strong'), soft: token('tide-soft') },
				signal: { DEFAULT: token('signal'), soft: token('signal-soft') },
				alarm: { DEFAULT: token('alarm'), soft: token('alarm-soft') },
				moss: { DEFAULT: token('moss'), soft: token('moss-soft') },
				focus: token('focus')
			},
			fontFamily: {
				sans: ['"Atkinson Hyperlegible Next Variable"', 'system-ui', 'sans-serif'],
				mono: ['"Atkinson Hyperlegible Mono Variable"', 'ui-monospace', 'monospace']
			},
			fontSize: {
				// A type scale of 1.2 from a 17 px body: readable at arm's length on a tablet.
				xs: ['0.8125rem', { lineHeight: '1.25rem' }],
				sm: ['0.9375rem', { lineHeight: '1.375rem' }],
				base: ['1.0625rem', { lineHeight: '1.625rem' }],
				lg: ['1.275rem', { lineHeight: '1.75rem' }],
				xl: ['1.53rem', { lineHeight: '2rem' }],
				'2xl': ['1.836rem', { lineHeight: '2.25rem' }],
				'3xl': ['2.203rem', { lineHeight: '2.5rem' }]
			},
			spacing: {
				touch: '2.75rem' // 44 CSS px, WCAG 2.2 target size (enhanced)
			},
			minHeight: { touch: '2.75rem' },
			minWidth: { touch: '2.75rem' },
			borderRadius: { card: '0.75rem' }
		}
	}
} satisfies Config;
