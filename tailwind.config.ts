import type { Config } from 'tailwindcss';

// Gridset's own palette: a slate frame, one indigo-blue accent for actions and selection, and the
// safety hues (ANSI Z535.1 / ISO 3864: red danger, orange warning, yellow caution, green safe)
// reserved for status words only.
export default {
  content: ['./index.html', './app/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        accent: { 50: '#eef2fb', 100: '#d9e1f6', 600: '#2f4fae', 700: '#27408b', 800: '#1f336e' },
        danger: { 50: '#fdecec', 700: '#b3261e' },
        warning: { 50: '#fff1e6', 700: '#b45309' },
        caution: { 50: '#fffbe0', 400: '#f5d000', 800: '#6b5900' },
        safe: { 50: '#e9f7ee', 700: '#1e7b3c' },
      },
      fontFamily: {
        sans: ['Inter', 'system-ui', 'sans-serif'],
        mono: ['"JetBrains Mono"', 'ui-monospace', 'monospace'],
      },
    },
  },
} satisfies Config;
