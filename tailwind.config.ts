import type { Config } from 'tailwindcss'
import typography from '@tailwindcss/typography'

// Tallymark's own design system: warm "paper" surfaces, a deep kiln-green ink and an ochre glaze accent.
// Every text colour pair used on pages meets WCAG 2.2 AA (4.5:1) on the paper and card backgrounds.
export default <Partial<Config>>{
  content: ['./components/**/*.vue', './layouts/**/*.vue', './pages/**/*.vue', './app.vue', './error.vue', './composables/**/*.ts'],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: '#f6f1e7', card: '#fffdf8', sunk: '#ece4d4', line: '#d9cfbd' },
        ink: { DEFAULT: '#1d2522', soft: '#4a524e', faint: '#5f6763' },
        kiln: { 50: '#eaf2ef', 100: '#cfe2dc', 200: '#a3c8bd', 500: '#2f6a5e', 600: '#245449', 700: '#1f3b36', 800: '#172c28' },
        glaze: { 100: '#f8e7cf', 300: '#e6b56f', 500: '#b4681c', 700: '#7d4510' },
        clay: { 100: '#f8dcd5', 500: '#b4412c', 700: '#8a2e1e' },
        moss: { 100: '#e1efd6', 700: '#3d6322' },
      },
      fontFamily: {
        serif: ['Merriweather', 'Georgia', 'serif'],
        sans: ['system-ui', '-apple-system', 'Segoe UI', 'Roboto', 'Noto Sans', 'Helvetica Neue', 'Arial', 'sans-serif'],
        mono: ['ui-monospace', 'DejaVu Sans Mono', 'Menlo', 'monospace'],
      },
      fontSize: {
        // A compact type scale: phone first, one step larger on wide screens where pages choose to.
        'xs': ['0.8125rem', { lineHeight: '1.15rem' }],
        'sm': ['0.9375rem', { lineHeight: '1.35rem' }],
        'base': ['1rem', { lineHeight: '1.55rem' }],
        'lg': ['1.1875rem', { lineHeight: '1.7rem' }],
        'xl': ['1.375rem', { lineHeight: '1.9rem' }],
        '2xl': ['1.75rem', { lineHeight: '2.25rem' }],
        '3xl': ['2.125rem', { lineHeight: '2.6rem' }],
      },
      spacing: { tap: '2.75rem' },
      borderRadius: { card: '0.5rem' },
      boxShadow: { card: '0 1px 0 rgba(29,37,34,0.06), 0 1px 3px rgba(29,37,34,0.08)' },
      maxWidth: { page: '72rem' },
    },
  },
  plugins: [typography],
}
