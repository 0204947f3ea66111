import type { Config } from 'tailwindcss';

// Placewright's own palette: "slate ink" neutrals, a copper accent (the colour of bare pads) and
// a solder-mask green for success. Severity colours are chosen to read on the dark canvas too.
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        ink: {
          50: '#f5f7f8', 100: '#e6eaed', 200: '#cdd5db', 300: '#a9b6c0', 400: '#7d8e9c',
          500: '#5d6f7e', 600: '#485865', 700: '#394650', 800: '#262f36', 900: '#171d22', 950: '#0d1114',
        },
        copper: {
          50: '#fdf6ef', 100: '#f9e6d3', 200: '#f1c8a3', 300: '#e7a46c', 400: '#dc8444',
          500: '#c9692b', 600: '#a95322', 700: '#87401f', 800: '#6d351e', 900: '#592d1b',
        },
        mask: { 400: '#4fae7a', 500: '#2f9160', 600: '#23744c', 700: '#1d5c3d' },
        sev: { error: '#d6453d', warning: '#e0a526', info: '#3f88c5' },
      },
      fontFamily: {
        sans: ['Inter', 'system-ui', 'sans-serif'],
        mono: ['"Roboto Mono"', 'ui-monospace', 'monospace'],
      },
      fontSize: {
        '2xs': ['0.6875rem', { lineHeight: '1rem' }],
      },
      spacing: { 13: '3.25rem', 18: '4.5rem' },
      borderRadius: { DEFAULT: '3px' },
    },
  },
} satisfies Config;
