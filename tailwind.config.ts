import type { Config } from 'tailwindcss'

// Pullsheet's own palette: warm paper, graphite ink, a signal orange for action
// and a deep teal for data. Contrast pairs used for text are AA or better.
export default {
  content: ['./app/**/*.{vue,ts}', './content/**/*.md', './shared/**/*.ts'],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: '#faf7f2', deep: '#f1ebe1', edge: '#e2d9cb' },
        ink: { DEFAULT: '#1f2328', soft: '#4a5058', faint: '#6b7078' },
        signal: { DEFAULT: '#c2410c', dark: '#9a3412', light: '#fed7aa' },
        gauge: { DEFAULT: '#0f5e66', dark: '#0b454b', light: '#d5ecee' },
        caution: { DEFAULT: '#8a5a00', bg: '#fff4d6', edge: '#e9c46a' },
      },
      fontFamily: {
        serif: ['Merriweather', 'Georgia', 'Cambria', 'serif'],
        sans: ['system-ui', '-apple-system', 'Segoe UI', 'Roboto', 'Helvetica Neue', 'Arial', 'sans-serif'],
      },
      maxWidth: { prose: '68ch' },
    },
  },
  plugins: [],
} satisfies Config
