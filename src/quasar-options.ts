// Quasar's plugins and Gapsight's brand colours, shared by main.ts and the component tests.
import { Dialog, Notify, type GlobalQuasarIconMapFn, type QuasarLanguage, type QuasarPluginOptions } from 'quasar';
import iconSet from 'quasar/icon-set/svg-material-icons';
import enUS from 'quasar/lang/en-US';
import { ICON_SVGS } from './icons';

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

// Quasar's words, with one change: an expansion item's header gets no aria-label of its own. Quasar's default
// ("Expand", or 'Expand "Audit trail"') replaces the header's visible words and caption as its accessible name, so a
// screen reader heard "Expand, button" for every mail and missed the caption ("4 entries"); aria-expanded already says
// whether it is open.
export const quasarLang: QuasarLanguage = {
  ...enUS,
  label: { ...enUS.label, expand: () => undefined, collapse: () => undefined },
} as unknown as QuasarLanguage;

// Icons as inline SVG, not the Material Icons font (128 kB of woff2 on every first visit): Quasar's own components
// (select arrows, table pagination, expansion chevrons, notify types) draw from its SVG icon set, and every name the app
// gives a q-icon or an icon prop is looked up in icons.ts (only those paths are bundled). Quasar reads the map
// function from config.iconMapFn, which its config type does not list, hence the separate typed object.
export const iconMapFn: GlobalQuasarIconMapFn = (name) => {
  const icon = ICON_SVGS[name];
  return icon === undefined ? undefined : { icon };
};

const config: NonNullable<QuasarPluginOptions['config']> & { iconMapFn: GlobalQuasarIconMapFn } = {
  brand: brandColours,
  notify: { position: 'top', timeout: 5000 },
  iconMapFn,
};

export const quasarOptions: Partial<QuasarPluginOptions> = {
  plugins: { Notify, Dialog },
  lang: quasarLang,
  iconSet,
  config,
};
