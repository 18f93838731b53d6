import type { Config } from 'tailwindcss';

// Sowcast's own palette: outdoor, calm, readable in sunlight.
const config: Config = {
  content: ['./app/**/*.{ts,tsx}', './components/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        loam: { DEFAULT: '#4a3b2f', soft: '#6b5a4b', faint: '#a39484' },
        clover: { DEFAULT: '#3d7a3a', dark: '#2f5f2d', light: '#e3efdf' },
        rain: { DEFAULT: '#2d6a98', light: '#e1ecf5' },
        straw: { DEFAULT: '#d8b45f', light: '#f6ecd2' },
        frost: { DEFAULT: '#7f9bb0', light: '#e8eef3' },
        ember: { DEFAULT: '#b9502a', light: '#f7e4dc' },
        ground: { DEFAULT: '#f7f4ec', raised: '#fffdf8', line: '#e4ddcc' },
      },
      fontFamily: {
        sans: ['var(--font-inter)', 'system-ui', 'sans-serif'],
      },
      fontSize: {
        // A clear scale: body 16 px, phones never below 14 px.
        xs: ['0.8125rem', { lineHeight: '1.25rem' }],
        sm: ['0.9375rem', { lineHeight: '1.375rem' }],
        base: ['1rem', { lineHeight: '1.5rem' }],
        lg: ['1.1875rem', { lineHeight: '1.75rem' }],
        xl: ['1.4375rem', { lineHeight: '2rem' }],
        '2xl': ['1.875rem', { lineHeight: '2.375rem' }],
        '3xl': ['2.5rem', { lineHeight: '3rem' }],
      },
      borderRadius: { card: '0.875rem' },
    },
  },
};

export default config;
