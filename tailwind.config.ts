/**
 * Tailwind configuration loaded by app/globals.css through `@config`.
 *
 * The palette and type scale live in the `@theme` block of app/globals.css (CSS variables,
 * usable from Konva and canvas code too). This file holds what is easier to express in
 * code: layout sizes shared by the app shell and the editor, and the `num` utilities for
 * engineering numbers (mono digits of equal width, slashed zero).
 */
import type { Config } from 'tailwindcss';
import plugin from 'tailwindcss/plugin';

const config: Config = {
  content: ['./app/**/*.{ts,tsx}', './components/**/*.{ts,tsx}'],
  theme: {
    extend: {
      spacing: {
        /** Height of the app header. */
        header: '3.25rem',
        /** Width of the editor's side panels. */
        panel: '20rem',
      },
      maxWidth: {
        /** Content width of list and settings pages. */
        page: '76rem',
        form: '26rem',
      },
      minWidth: {
        /** The app is laid out for 1024 px and wider. */
        app: '1024px',
      },
    },
  },
  plugins: [
    plugin(({ addUtilities }) => {
      addUtilities({
        /** Engineering numbers: mono, equal-width digits, slashed zero. */
        '.num': {
          'font-family': 'var(--font-mono)',
          'font-variant-numeric': 'tabular-nums slashed-zero',
          'letter-spacing': '-0.01em',
        },
        /** Tabular digits in the sans face (tables of dates, counts). */
        '.num-sans': {
          'font-variant-numeric': 'tabular-nums',
        },
      });
    }),
  ],
};

export default config;
