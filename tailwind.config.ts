import type { Config } from 'tailwindcss';

/** Spoolwright's own palette: steel greys with a copper accent. */
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      fontFamily: {
        sans: ['Barlow', 'system-ui', 'sans-serif'],
      },
      colors: {
        steel: {
          50: '#f4f6f8',
          100: '#e6eaef',
          200: '#cbd3dc',
          300: '#a3b0bf',
          400: '#5e6f84',
          500: '#55667c',
          600: '#425064',
          700: '#364151',
          800: '#2b3440',
          900: '#1d232c',
        },
        copper: {
          400: '#e8a06a',
          500: '#a95a24',
          600: '#8a4a1c',
        },
      },
    },
  },
} satisfies Config;
