import type { Config } from 'tailwindcss';

/**
 * Luxtrail's own look: night-ink surfaces, a warm lamp accent, and verdict colours chosen
 * to stay apart for colour-blind readers (always paired with a label or an icon).
 */
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      fontFamily: {
        sans: ['"Instrument Sans Variable"', 'system-ui', 'sans-serif'],
      },
      colors: {
        ink: {
          50: '#f4f6fb', 100: '#e6eaf4', 200: '#c9d1e6', 300: '#9eabcb', 400: '#6f7fa8',
          500: '#4e5e88', 600: '#3b486d', 700: '#2d3857', 800: '#1f2840', 900: '#141b2d', 950: '#0b101c',
        },
        lamp: {
          50: '#fff8eb', 100: '#ffedc8', 200: '#ffd98a', 300: '#fbc55a', 400: '#f5b53d',
          500: '#e29a1c', 600: '#bd7812', 700: '#955b12', 800: '#794916', 900: '#653d17',
        },
        meets: { 50: '#eefbf6', 100: '#d3f3e6', 500: '#1b9e77', 600: '#137a5c', 700: '#0f5f48' },
        short: { 50: '#fdf1f4', 100: '#fadbe3', 500: '#c2185b', 600: '#9c1249', 700: '#7a0f3a' },
        unsure: { 50: '#f5f3fb', 100: '#e7e2f5', 500: '#6a51a3', 600: '#553f88', 700: '#43316c' },
      },
      boxShadow: {
        card: '0 1px 2px rgb(20 27 45 / 0.06), 0 4px 16px -4px rgb(20 27 45 / 0.08)',
      },
    },
  },
} satisfies Config;
