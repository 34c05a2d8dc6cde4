import type { Config } from 'tailwindcss'

// Tidewright's own look: deep-water ink, a tide teal for action, warm sand surfaces,
// and signal colours kept for water-quality meaning only. Every colour used for text reaches
// WCAG AA (4.5:1) on white and on every sand surface down to sand-200, and on the pale tints
// the status pills use; tests/browser/accessibility.test.ts checks each page with axe-core.
export default {
  content: ['./app/**/*.{vue,ts}', './shared/**/*.ts'],
  theme: {
    extend: {
      fontFamily: {
        // The fallback face is a local Arial scaled to Source Sans 3 (app/assets/css/fonts.css).
        sans: ['"Source Sans 3"', '"Source Sans 3 Fallback"', 'system-ui', 'sans-serif'],
      },
      colors: {
        ink: { DEFAULT: '#12303a', soft: '#35525c', faint: '#4f646c' },
        tide: { 50: '#e8f5f4', 100: '#c9e8e5', 300: '#6fbdb6', 500: '#16808a', 600: '#0f6a73', 700: '#0b545c' },
        sand: { 50: '#fbf8f2', 100: '#f4eee2', 200: '#e7dcc6', 300: '#d6c6a5' },
        signal: { safe: '#2f6a37', caution: '#87570b', danger: '#ad3a2c', info: '#285f88' },
        // One colour per measured series, in every chart and its legend (app/utils/chart-palette.ts).
        // Kept apart from the signal colours: red, amber and green mean danger, caution and safe only.
        series: { ammonia: '#0f6a73', nitrite: '#6b46c1', nitrate: '#2b59c3', freeAmmonia: '#a0307a', salinity: '#0891b2', temperature: '#12303a' },
      },
      fontSize: {
        label: ['0.8125rem', { lineHeight: '1.1rem', letterSpacing: '0.02em' }],
        body: ['1rem', { lineHeight: '1.5rem' }],
        lead: ['1.125rem', { lineHeight: '1.65rem' }],
        title: ['1.5rem', { lineHeight: '2rem', fontWeight: '700' }],
        display: ['2rem', { lineHeight: '2.4rem', fontWeight: '700' }],
      },
      borderRadius: { card: '0.875rem' },
      boxShadow: { card: '0 1px 2px rgba(18,48,58,0.08), 0 4px 16px rgba(18,48,58,0.06)' },
    },
  },
  plugins: [],
} satisfies Config
