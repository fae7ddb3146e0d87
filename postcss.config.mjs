/** Tailwind CSS 4 through its PostCSS plugin; the theme lives in app/globals.css (@theme) and tailwind.config.ts (@config). */
export default {
  plugins: { '@tailwindcss/postcss': {} },
};
