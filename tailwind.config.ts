import type { Config } from 'tailwindcss';

/**
 * Takeproof's palette: "proof paper" by day, "night desk" in the dark. Every
 * colour is a CSS variable set in app/globals.css per theme, so components
 * use one class and both themes follow.
 */
const token = (name: string) => `rgb(var(--tp-${name}) / <alpha-value>)`;

const config: Config = {
  content: ['./app/**/*.{ts,tsx}', './components/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        paper: token('paper'),
        surface: token('surface'),
        sunken: token('sunken'),
        ink: token('ink'),
        muted: token('muted'),
        line: token('line'),
        accent: token('accent'),
        'on-accent': token('on-accent'),
        pass: token('pass'),
        warn: token('warn'),
        fail: token('fail'),
        focus: token('focus'),
      },
      fontFamily: {
        sans: ['var(--font-sans)', 'system-ui', 'sans-serif'],
        mono: ['var(--font-mono)', 'ui-monospace', 'monospace'],
      },
      borderRadius: { card: '0.625rem' },
    },
  },
};

export default config;
