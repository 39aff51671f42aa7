import type { Config } from 'tailwindcss'

// Larmoir's own palette: paper and ink for reading, a deep lagoon for actions, and a warm amber
// for the film and tears in diagrams. Lora for headings and cards, the system sans for dense tables.
export default {
  content: [
    './components/**/*.{vue,ts}',
    './layouts/**/*.vue',
    './pages/**/*.vue',
    './app.vue',
    './composables/**/*.ts',
  ],
  theme: {
    extend: {
      colors: {
        paper: '#faf7f1',
        ink: { DEFAULT: '#1e2326', soft: '#4a5459', faint: '#58636a' },
        lagoon: { 50: '#eef6f5', 100: '#d5eae7', 300: '#83bdb5', 500: '#2f7d74', 600: '#25665f', 700: '#1c4f4a', 900: '#10302d' },
        amber: { 100: '#fbefd9', 300: '#efc27a', 500: '#c98a2b', 700: '#8a5a12' },
        brick: { 100: '#f8e3df', 500: '#b3442f', 700: '#83301f' },
        line: '#e3ddd2',
      },
      fontFamily: {
        serif: ['Lora', 'Georgia', 'serif'],
        sans: ['ui-sans-serif', 'system-ui', '-apple-system', 'Segoe UI', 'Roboto', 'Helvetica Neue', 'Arial', 'sans-serif'],
      },
      minHeight: { touch: '2.75rem' },
    },
  },
  plugins: [],
} satisfies Config
