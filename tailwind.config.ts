import type { Config } from 'tailwindcss';

// Sheetsmith's own palette: deep spruce ink on warm paper, with a coral "peel" accent and a
// sage for success. Contrast of ink on paper is above 12:1; coral-deep on paper and ink-faint on every
// paper tone at least 4.5:1 (WCAG 2.1 §1.4.3; tests/e2e/accessibility.test.ts checks it with axe-core).
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        ink: { DEFAULT: '#1f3a3d', soft: '#3d5a5c', faint: '#546b6d' },
        paper: { DEFAULT: '#fff7ec', deep: '#f6ead8', edge: '#e7d6bd' },
        peel: { DEFAULT: '#f08a5d', deep: '#b4532a', light: '#fde1d2' },
        sage: { DEFAULT: '#5d9c7c', deep: '#2f6b4f', light: '#dcefe4' },
        alarm: { DEFAULT: '#c23b3b', light: '#fbe3e0' },
      },
      fontFamily: {
        sans: ['Nunito', 'ui-sans-serif', 'system-ui', 'sans-serif'],
      },
      borderRadius: { sticker: '1.25rem' },
    },
  },
} satisfies Config;
