import type { Config } from 'tailwindcss'

// Lathercase's own palette: a soft cream page, olive-green actions, a clay accent
// for attention, and warm greys for text. Shades were checked for WCAG AA contrast
// against white and cream (text uses ink-700 and darker; buttons use olive-700).
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        cream: { 50: '#fdfcf9', 100: '#faf7f1', 200: '#f2ece1', 300: '#e6dccb' },
        ink: {
          300: '#b9b3aa',
          400: '#8f887e',
          500: '#6f685f',
          600: '#57514a',
          700: '#413c37',
          800: '#2d2a26',
          900: '#1d1b18',
        },
        olive: {
          50: '#f2f6ef',
          100: '#e1eadb',
          200: '#c3d5b8',
          300: '#9dba8d',
          500: '#5e8a4c',
          600: '#4a7139',
          700: '#3b5b2d',
          800: '#2f4824',
          900: '#23361b',
        },
        clay: { 50: '#fbf1ec', 100: '#f5dccf', 300: '#e3a083', 500: '#c4643f', 600: '#a9502f', 700: '#8a3f24' },
        honey: { 50: '#fdf7e6', 100: '#f9e9b8', 500: '#c8951b', 700: '#85620f' },
      },
      fontFamily: {
        sans: ['Roboto', 'system-ui', 'sans-serif'],
      },
      fontSize: {
        xs: ['0.75rem', { lineHeight: '1rem' }],
        sm: ['0.875rem', { lineHeight: '1.25rem' }],
        base: ['1rem', { lineHeight: '1.5rem' }],
        lg: ['1.125rem', { lineHeight: '1.75rem' }],
        xl: ['1.375rem', { lineHeight: '1.875rem' }],
        '2xl': ['1.75rem', { lineHeight: '2.25rem' }],
      },
      borderRadius: { card: '0.75rem' },
      boxShadow: { card: '0 1px 2px rgb(45 42 38 / 0.06), 0 2px 8px rgb(45 42 38 / 0.05)' },
    },
  },
} satisfies Config
