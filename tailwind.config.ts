import type { Config } from 'tailwindcss'
import defaultTheme from 'tailwindcss/defaultTheme'

// Lamina's palette: a slate "ink" for text and chrome, warm "paper" surfaces,
// and one colour per kind of block so a protocol reads at a glance on its tracks.
export default {
  content: ['./app/**/*.{vue,ts}'],
  theme: {
    extend: {
      fontFamily: {
        sans: ['"Space Grotesk"', ...defaultTheme.fontFamily.sans],
      },
      colors: {
        ink: {
          50: '#f3f6f7', 100: '#e1e8eb', 200: '#c3d0d6', 300: '#9aafb9', 400: '#6c8795',
          500: '#4f6a79', 600: '#3e5563', 700: '#324552', 800: '#263641', 900: '#1c2a33', 950: '#101a20',
        },
        paper: { DEFAULT: '#f8f6f1', dim: '#efebe2', deep: '#e4ded1' },
        // Holds: a warm clay.
        clay: { 100: '#f8e6d9', 300: '#eab28c', 500: '#d0733f', 600: '#b65d2d', 700: '#8f4623' },
        // Breathing: a cool lagoon.
        lagoon: { 100: '#dcefef', 300: '#8ccaca', 500: '#2f8f93', 600: '#237579', 700: '#1b5b5e' },
        // Rest: a muted sage.
        sage: { 100: '#e7eee3', 300: '#b6c9ab', 500: '#7d9a6d', 600: '#637d55', 700: '#4c6041' },
        // Findings.
        alarm: { 50: '#fdf0ef', 500: '#c2372d', 700: '#8e2620' },
        caution: { 50: '#fdf6e7', 500: '#b7791f', 700: '#7c5214' },
      },
      boxShadow: { card: '0 1px 2px rgb(16 26 32 / 0.06), 0 4px 16px rgb(16 26 32 / 0.06)' },
    },
  },
} satisfies Config
