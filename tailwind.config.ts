import type { Config } from 'tailwindcss';

/**
 * Tautline's own look: a warm "brass and slate" palette readable in a dim studio,
 * Space Grotesk shipped with the app, and one spacing scale.
 */
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  darkMode: 'selector',
  theme: {
    extend: {
      fontFamily: {
        sans: ['"Space Grotesk"', 'system-ui', 'sans-serif'],
      },
      colors: {
        slate: {
          950: '#101318',
          900: '#171b22',
          800: '#222834',
          700: '#323a4a',
          300: '#b7bfcc',
          100: '#e6e9ef',
        },
        brass: {
          300: '#f2cf7e',
          400: '#e8b64f',
          500: '#d49a2a',
          600: '#a8741a',
        },
        teal: {
          400: '#4cc7b8',
          600: '#1f8f82',
        },
        ember: {
          300: '#f6a98f',
          400: '#ef8566',
          500: '#e0623f',
          600: '#c24b2b',
          700: '#9a3a20',
        },
      },
      spacing: {
        gutter: '1.5rem',
      },
    },
  },
} satisfies Config;
