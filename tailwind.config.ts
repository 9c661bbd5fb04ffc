import type { Config } from 'tailwindcss';

/**
 * Planktide's design tokens. Colours are defined in src/styles.css (@theme) so Tailwind 4 picks
 * them up; this file names the content to scan and the font stack, loaded with @config.
 */
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      fontFamily: {
        sans: ['"Nunito Sans"', 'system-ui', 'sans-serif'],
      },
    },
  },
} satisfies Config;
