import type { Config } from 'tailwindcss';

/**
 * Chromaslate's theme. Surfaces and text come from CSS variables (set per theme in src/app.css), so
 * the dark set theme and the light desk theme share every class. Accent hues are fixed values:
 * a dim amber ("tally") for actions and a cool cyan ("cue") for the target white, chosen to stay
 * legible on a dimmed phone without throwing bright light around a dark set.
 */
export default {
	content: ['./src/**/*.{html,svelte,ts,js}'],
	theme: {
		extend: {
			colors: {
				surface: {
					DEFAULT: 'var(--cs-surface)',
					raised: 'var(--cs-surface-raised)',
					sunken: 'var(--cs-surface-sunken)',
					line: 'var(--cs-line)'
				},
				ink: {
					DEFAULT: 'var(--cs-ink)',
					muted: 'var(--cs-ink-muted)',
					faint: 'var(--cs-ink-faint)'
				},
				tally: {
					300: '#f5c46e',
					400: '#e9a23b',
					500: '#c9821f',
					600: '#9c6112',
					DEFAULT: 'var(--cs-tally)'
				},
				cue: {
					300: '#8fd9e0',
					400: '#4fbfcb',
					500: '#2b9aa8',
					DEFAULT: 'var(--cs-cue)'
				},
				verdict: {
					good: 'var(--cs-good)',
					warn: 'var(--cs-warn)',
					bad: 'var(--cs-bad)'
				}
			},
			fontFamily: {
				sans: ['"Inter Variable"', 'system-ui', 'sans-serif'],
				mono: ['"JetBrains Mono Variable"', 'ui-monospace', 'monospace']
			},
			spacing: {
				// The smallest comfortable thumb target on a phone held at arm's length.
				touch: '3rem',
				gutter: '1.25rem'
			},
			borderRadius: {
				panel: '0.875rem'
			}
		}
	}
} satisfies Config;
