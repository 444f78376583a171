// Quasar's plugins and Gapsight's brand colours, shared by main.ts and the component tests.
import { Dialog, Notify, type QuasarPluginOptions } from 'quasar';

// Brand colours (Quasar sets them as CSS variables at run time; no Sass build). Contrast ratios in css/app.css.
export const brandColours = {
  primary: '#3d5467', // slate
  secondary: '#a4582a', // copper
  accent: '#a4582a', // copper — the windings
  dark: '#24292f', // graphite
  'dark-page': '#1b1f24',
  positive: '#0f766e', // teal = level ok
  negative: '#a61b34', // crimson = level critical
  info: '#2f6690',
  warning: '#e9a800', // amber = level watch (dark text on it)
};

export const quasarOptions: Partial<QuasarPluginOptions> = {
  plugins: { Notify, Dialog },
  config: {
    brand: brandColours,
    notify: { position: 'top', timeout: 5000 },
  },
};
