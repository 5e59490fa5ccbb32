import type { Config } from 'tailwindcss';

// Crosswatt's own palette: warm paper, deep "fjord" teal for structure, "ember"
// copper for the device under test, "moss" for its partner meter. Text colours
// are chosen to pass WCAG AA on paper.
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: '#f8f6f1', deep: '#efebe2', line: '#ddd6c8' },
        ink: { DEFAULT: '#1d2428', soft: '#4a5358', faint: '#6b7378' },
        fjord: { 50: '#eef6f6', 100: '#d3e8e8', 300: '#7fb5b6', 500: '#2f7b7e', 700: '#1d5557', 900: '#103335' },
        ember: { 50: '#fdf2ec', 100: '#f9dccb', 300: '#eb9a6c', 500: '#c8622e', 700: '#96421a', 900: '#5a2610' },
        moss: { 100: '#e3ecd5', 500: '#5d7f2f', 700: '#41591f' },
        alert: { 100: '#f8dede', 600: '#b42828', 800: '#7c1a1a' },
        caution: { 100: '#f7ecc9', 600: '#8a6410' },
      },
      fontFamily: {
        sans: ['"Work Sans"', 'system-ui', 'sans-serif'],
      },
      fontSize: {
        caption: ['0.8125rem', { lineHeight: '1.25rem' }],
        body: ['1rem', { lineHeight: '1.6rem' }],
        lead: ['1.1875rem', { lineHeight: '1.85rem' }],
        title: ['1.75rem', { lineHeight: '2.25rem', letterSpacing: '-0.01em' }],
        display: ['2.75rem', { lineHeight: '3.1rem', letterSpacing: '-0.02em' }],
      },
      borderRadius: { card: '0.875rem' },
      maxWidth: { page: '72rem' },
      boxShadow: { card: '0 1px 2px rgb(29 36 40 / 0.06), 0 4px 16px rgb(29 36 40 / 0.05)' },
    },
  },
} satisfies Config;
