import type { Config } from 'tailwindcss'

// Floatwise design tokens: one place for palette, spacing, radii and type.
// Colours are named for what they do, so themes swap values in assets/css/main.css.
export default {
  darkMode: 'class',
  content: [
    './components/**/*.{vue,ts}',
    './layouts/**/*.vue',
    './pages/**/*.vue',
    './app.vue',
    './error.vue',
    './composables/**/*.ts',
  ],
  theme: {
    extend: {
      colors: {
        // Themeable roles, values in CSS variables (light and dark in main.css).
        'canvas': 'rgb(var(--fw-canvas) / <alpha-value>)',
        'surface': 'rgb(var(--fw-surface) / <alpha-value>)',
        'ink': 'rgb(var(--fw-ink) / <alpha-value>)',
        'muted': 'rgb(var(--fw-muted) / <alpha-value>)',
        'line': 'rgb(var(--fw-line) / <alpha-value>)',
        'accent': 'rgb(var(--fw-accent) / <alpha-value>)',
        'accent-ink': 'rgb(var(--fw-accent-ink) / <alpha-value>)',
        'focus': 'rgb(var(--fw-focus) / <alpha-value>)',
        'ok': 'rgb(var(--fw-ok) / <alpha-value>)',
        'warn': 'rgb(var(--fw-warn) / <alpha-value>)',
        'danger': 'rgb(var(--fw-danger) / <alpha-value>)',
        'danger-ink': 'rgb(var(--fw-danger-ink) / <alpha-value>)',
        // Fixed brand hues: deep loch teal, heather, oat.
        'loch': { 50: '#eef6f7', 100: '#d3e7ea', 300: '#7fb2bb', 500: '#2f6f7f', 700: '#1f4e5f', 900: '#10303b' },
        'heather': { 100: '#f1e6ee', 300: '#c9a3bd', 500: '#8e5a7e', 700: '#643c58' },
        'oat': { 50: '#fbf9f4', 100: '#f7f4ee', 200: '#ebe4d6', 400: '#c9bca2', 600: '#8a7d63' },
      },
      fontFamily: {
        sans: ['Nunito', 'system-ui', 'sans-serif'],
      },
      spacing: {
        'tap': '2.75rem', // 44 px: the smallest touch target we allow
        'tap-lg': '4rem',
      },
      minHeight: { tap: '2.75rem' },
      minWidth: { tap: '2.75rem' },
      borderRadius: {
        card: '1rem',
        control: '0.75rem',
      },
      fontSize: {
        // The row pair at the machine: as large as the screen allows in either orientation.
        huge: ['clamp(3.5rem, min(12vw, 12vh), 9rem)', { lineHeight: '1' }],
        // What to do before a row (shaping): read from a metre away, 24 px on phones, 32 px and up on tablets.
        knit: ['clamp(1.5rem, 3.2vw, 2.25rem)', { lineHeight: '1.15' }],
      },
    },
  },
  plugins: [],
} satisfies Config
