import type { Config } from 'tailwindcss'

// Tamp's palette: deep moss for the frame, crushed-stone greys, a safety amber for what needs attention.
// Contrast is chosen to read on a phone in direct sunlight.
export default {
  content: ['./app/**/*.{vue,ts}'],
  theme: {
    extend: {
      fontFamily: {
        sans: ['"Atkinson Hyperlegible"', 'system-ui', 'sans-serif'],
      },
      colors: {
        moss: { 50: '#eef5f0', 100: '#d5e8db', 600: '#2e5a43', 700: '#234735', 800: '#1f3a2e', 900: '#142820' },
        stone: { 50: '#f6f5f2', 100: '#e9e6df', 300: '#c4beb1', 500: '#7d766a', 600: '#625b50', 700: '#4a453d', 900: '#24211d' },
        amber: { 100: '#fdf0cc', 500: '#d99a06', 700: '#8a5a00' },
        brick: { 100: '#f9dcd5', 600: '#b23a1e', 800: '#7a2410' },
      },
      minHeight: { touch: '44px' },
      minWidth: { touch: '44px' },
    },
  },
} satisfies Config
