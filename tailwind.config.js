/** Crownwatch design tokens: a calm concrete grey base with one strong accent (safety orange-red). */
/** @type {import('tailwindcss').Config} */
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        ink: '#15191d',
        concrete: {
          50: '#f5f5f3', 100: '#e9e8e4', 200: '#d4d2cc', 300: '#b4b1a9', 400: '#8d8a82',
          500: '#6b6962', 600: '#54534d', 700: '#3f3e3a', 800: '#2b2a27', 900: '#1b1a18',
        },
        accent: { DEFAULT: '#b8400f', light: '#fbe7dd', dark: '#8a2e08', deep: '#6b2306' },
        ok: { DEFAULT: '#1d6b3a', light: '#dff2e5' },
        warn: { DEFAULT: '#8a5a00', light: '#fdf0cf' },
        bad: { DEFAULT: '#a3171b', light: '#fbe1e1' },
      },
      fontFamily: { sans: ['"IBM Plex Sans"', 'system-ui', 'sans-serif'] },
      fontSize: { yard: ['1.25rem', { lineHeight: '1.75rem' }] },
      minHeight: { touch: '44px' },
      minWidth: { touch: '44px' },
    },
  },
  plugins: [],
};
