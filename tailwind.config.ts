import type { Config } from 'tailwindcss'

// Colours are CSS variables (assets/css/main.css) so the night and day themes swap with one class.
const v = (name: string) => `rgb(var(--${name}) / <alpha-value>)`

export default {
  darkMode: 'class',
  content: ['./components/**/*.vue', './layouts/**/*.vue', './pages/**/*.vue', './app.vue', './error.vue', './composables/**/*.ts', './utils/**/*.ts'],
  theme: {
    extend: {
      colors: {
        'canvas': v('canvas'),
        'surface': v('surface'),
        'raised': v('raised'),
        'line': v('line'),
        'ink': v('ink'),
        'dim': v('dim'),
        'accent': v('accent'),
        'accent-ink': v('accent-ink'),
        'ok': v('ok'),
        'warn': v('warn'),
        'bad': v('bad'),
        'info': v('info'),
      },
      fontFamily: {
        sans: ['"IBM Plex Sans"', 'system-ui', 'sans-serif'],
        mono: ['"JetBrains Mono"', 'ui-monospace', 'monospace'],
      },
      fontSize: { '2xs': ['0.6875rem', '1rem'] },
      boxShadow: { panel: '0 1px 0 rgb(var(--line) / 0.6), 0 8px 24px -12px rgb(0 0 0 / 0.45)' },
    },
  },
} satisfies Config
