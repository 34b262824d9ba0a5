import type { Config } from 'tailwindcss'

// Colours come from CSS variables (assets/css/main.css) so one class works in the light and
// the dark shop theme. Signal colours follow the ANSI Z535 / ISO 3864 meanings.
const v = (name: string) => `rgb(var(--c-${name}) / <alpha-value>)`

export default {
  darkMode: 'class',
  // Hover colours only where a pointer can hover: on a touch screen a tapped control would keep
  // its hover colour under the finger (a chosen signer turning unreadable, say).
  future: { hoverOnlyWhenSupported: true },
  content: [],
  theme: {
    extend: {
      colors: {
        'surface': v('surface'),
        'panel': v('panel'),
        'raised': v('raised'),
        'ink': v('ink'),
        'muted': v('muted'),
        'edge': v('edge'),
        'go': v('go'),
        'go-ink': v('go-ink'),
        'focus': v('focus'),
        'danger': v('danger'),
        'danger-ink': v('danger-ink'),
        'warning': v('warning'),
        'caution': v('caution'),
        'notice': v('notice'),
        // Our own colours for things that are not hazards (due work, guided runs, the cutter's path).
        'due': v('due'),
        'due-ink': v('due-ink'),
        'guide': v('guide'),
      },
      fontFamily: {
        sans: ['"Atkinson Hyperlegible"', 'system-ui', 'sans-serif'],
        mono: ['"IBM Plex Mono"', 'ui-monospace', 'monospace'],
      },
      minHeight: { touch: '64px' },
      minWidth: { touch: '64px' },
      spacing: { touch: '64px' },
    },
  },
} satisfies Config
