// Linkwright's theme tokens. Colours are CSS variables (see src/app.css) so light and dark share one set of names.
import type { Config } from 'tailwindcss';

export default {
	content: ['./src/**/*.{html,svelte,ts}'],
	theme: {
		extend: {
			colors: {
				surface: 'rgb(var(--lw-surface) / <alpha-value>)',
				panel: 'rgb(var(--lw-panel) / <alpha-value>)',
				sunken: 'rgb(var(--lw-sunken) / <alpha-value>)',
				ink: 'rgb(var(--lw-ink) / <alpha-value>)',
				muted: 'rgb(var(--lw-muted) / <alpha-value>)',
				line: 'rgb(var(--lw-line) / <alpha-value>)',
				accent: 'rgb(var(--lw-accent) / <alpha-value>)',
				'accent-ink': 'rgb(var(--lw-accent-ink) / <alpha-value>)',
				good: 'rgb(var(--lw-good) / <alpha-value>)',
				warn: 'rgb(var(--lw-warn) / <alpha-value>)',
				bad: 'rgb(var(--lw-bad) / <alpha-value>)'
			},
			fontFamily: {
				sans: ['"Inter Variable"', 'system-ui', 'sans-serif'],
				mono: ['"JetBrains Mono"', 'ui-monospace', 'monospace']
			},
			borderRadius: { panel: '0.625rem' }
		}
	}
} satisfies Config;
