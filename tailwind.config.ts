import type { Config } from 'tailwindcss';

/**
 * Kerfline's look: a shop-floor print. Warm paper, graphite ink, one copper accent; signal colours follow
 * the meanings of ISO 3864 (red stop, yellow caution, green safe, blue instruction) and are for status only.
 */
export default {
  content: ['./index.html', './apps/web/src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: '#F5F2EC', deep: '#ECE7DD' },
        card: '#FFFDF9',
        ink: { DEFAULT: '#1E2226', muted: '#545C64', faint: '#8A9199' },
        rule: '#D8D1C4',
        accent: { DEFAULT: '#A4502A', dark: '#7E3B1D', soft: '#F3E3D8' },
        signal: {
          stop: '#B3261E',
          'stop-soft': '#FBE4E1',
          caution: '#8A6400',
          'caution-bg': '#F6C64A',
          'caution-soft': '#FDF1CF',
          safe: '#1E6B3A',
          'safe-soft': '#DDEFE2',
          info: '#1F5A99',
          'info-soft': '#DDE8F5',
        },
      },
      fontFamily: {
        sans: ['Manrope', 'ui-sans-serif', 'system-ui', 'sans-serif'],
      },
      borderRadius: { sheet: '6px' },
    },
  },
} satisfies Config;
