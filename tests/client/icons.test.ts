// Icons are inline SVG (src/icons.ts + Quasar's 'svg-material-icons' set), not the Material Icons font. A name missing
// from the map would fall back to a font ligature that is no longer loaded: the person would see the bare word
// ("warning") instead of the icon. So this test reads every icon name the sources give (in the usual places) and
// checks the map has it, and mounts a few components to see an <svg> where the icon was a ligature.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { mount } from '@vue/test-utils';
import { matExpandLess, matExpandMore, matVisibility, matArrowDropDown } from '@quasar/extras/material-icons';
import { Quasar, QBtn, QSelect } from 'quasar';
import { describe, expect, it } from 'vitest';
import { h } from 'vue';
import AppLevelBadge from '../../src/components/AppLevelBadge.vue';
import EventSection from '../../src/components/event/EventSection.vue';
import { ICON_SVGS } from '../../src/icons';
import { quasarOptions } from '../../src/quasar-options';

const root = join(__dirname, '../..');

function sourceFiles(dir: string, out: string[] = []): string[] {
  for (const name of readdirSync(dir)) {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) sourceFiles(path, out);
    else if (/\.(vue|ts)$/.test(name)) out.push(path);
  }
  return out;
}

// The string literals of an expression that can be its value: `a ? 'x' : 'y'`, `s ?? 'x'`, `'x'` — not the operands
// of a comparison or a call (`kind === 'reset' ? …`, `type.startsWith('application/pdf')`).
function resultLiterals(expr: string): string[] {
  return [...expr.matchAll(/'([^'\\]*)'|"([^"\\]*)"|`([^`$\\]*)`/g)]
    .filter((m) => /(^|\?|:|\?\?|\|\|)\s*$/.test(expr.slice(0, m.index)))
    .map((m) => m[1] ?? m[2] ?? m[3]);
}

// An expression up to the next comma, semicolon, closing brace or line end outside quotes.
const EXPRESSION = String.raw`((?:[^,;}\n'"\x60]|'[^'\n]*'|"[^"\n]*"|\x60[^\x60\n]*\x60)*)`;

function scanScript(code: string): string[] {
  const found: string[] = [];
  // `icon: 'x'`, `okIcon: a ? 'x' : 'y'`, `icon = 'x'`, `icon ?? 'x'` (label tables, props' defaults, Notify options)
  for (const m of code.matchAll(new RegExp(String.raw`\b\w*[iI]con\??\s*(?::|=(?!=)|\?\?|\|\|)\s*` + EXPRESSION, 'g'))) {
    found.push(...resultLiterals(m[1]));
  }
  // a table of icons by key: `const ICONS: Record<Level, string> = { ok: 'check_circle', … }`
  for (const m of code.matchAll(/\b[A-Z_]*ICONS?\b(?:\s*:[^=\n]*)?\s*=\s*\{([^{}]*)\}/g)) {
    for (const v of m[1].matchAll(/:\s*'([^']*)'/g)) found.push(v[1]);
  }
  return found;
}

// Icon names in a .vue file's template (any attribute whose name holds "icon": icon, icon-right, dropdown-icon…;
// `name` on q-icon; bound ones by their result literals) and in its scripts; or in a .ts file.
function iconNamesIn(text: string, vue: boolean): string[] {
  if (!vue) return scanScript(text);
  const found: string[] = [];
  for (const tag of text.matchAll(/<([a-zA-Z][\w-]*)\b((?:[^>"']|"[^"]*"|'[^']*')*)>/g)) {
    const isIcon = /^(q-icon|QIcon)$/.test(tag[1]);
    for (const [, bound, name, value] of tag[2].matchAll(/\s(:|v-bind:)?([\w-]+)="([^"]*)"/g)) {
      if (!/icon/i.test(name) && !(isIcon && name === 'name')) continue;
      if (bound) found.push(...resultLiterals(value));
      else found.push(value);
    }
  }
  for (const s of text.matchAll(/<script[^>]*>([\s\S]*?)<\/script>/g)) found.push(...scanScript(s[1]));
  return found;
}

function namesInSources(): Map<string, string[]> {
  const files = [...sourceFiles(join(root, 'src')), ...sourceFiles(join(root, 'shared'))];
  const names = new Map<string, string[]>();
  for (const file of files) {
    if (file === join(root, 'src/icons.ts')) continue;
    for (const name of iconNamesIn(readFileSync(file, 'utf8'), file.endsWith('.vue'))) {
      names.set(name, [...(names.get(name) ?? []), relative(root, file)]);
    }
  }
  return names;
}

const svgPathsOf = (svg: string) => svg.split('|')[0].split('&&').map((p) => p.split('@@')[0]);

// A q-icon (<i class="q-icon">) holding one <svg> with the icon's paths, and no ligature word or font class.
function expectSvgIcon(icon: Element | null, svg: string) {
  expect(icon).not.toBeNull();
  expect(icon!.classList.contains('q-icon')).toBe(true);
  expect(icon!.classList.contains('material-icons')).toBe(false);
  expect(icon!.textContent).toBe('');
  const svgs = icon!.querySelectorAll(':scope > svg');
  expect(svgs).toHaveLength(1);
  expect(svgs[0].getAttribute('viewBox')).toBe('0 0 24 24');
  expect([...svgs[0].querySelectorAll('path')].map((p) => p.getAttribute('d'))).toEqual(svgPathsOf(svg));
}

describe('icons', () => {
  it('finds icon names where the sources give them (template attributes, bound ternaries, label tables)', () => {
    const vue = `<template>
      <q-btn flat icon="zz_static" label="Go" />
      <q-icon :name="open ? 'zz_open' : 'zz_closed'" aria-hidden="true" class="x-icon" />
      <q-select dropdown-icon="zz_drop" />
      <q-btn :icon="kind === 'reset' ? 'zz_reset' : 'zz_other'" />
      <q-btn :icon="a.type.startsWith('application/pdf') ? 'zz_pdf' : 'zz_doc'" />
      <DeskList name="not_an_icon" :name="'nor_this'" />
    </template>
    <script setup lang="ts">
    const STATES = { open: { word: 'Open', icon: 'zz_table' } };
    const ICONS: Record<string, string> = { ok: 'zz_keyed' };
    Notify.create({ message: 'Saved', icon: 'zz_notify' });
    </script>`;
    expect(iconNamesIn(vue, true).sort()).toEqual(
      ['zz_closed', 'zz_doc', 'zz_drop', 'zz_keyed', 'zz_notify', 'zz_open', 'zz_other', 'zz_pdf', 'zz_reset', 'zz_static', 'zz_table'].sort(),
    );
    expect(iconNamesIn(`export const X = { a: { word: 'A', icon: 'zz_shared' } };`, false)).toEqual(['zz_shared']);
  });

  it('has an SVG for every icon name in src/ and shared/, and nothing it does not use', () => {
    const names = namesInSources();
    expect(names.size).toBeGreaterThan(50); // the scan found the app's icons at all
    for (const known of ['expand_less', 'expand_more', 'warning', 'check', 'picture_as_pdf', 'visibility', 'pan_tool']) {
      expect(names.has(known), known).toBe(true);
    }
    const unmapped = [...names].filter(([name]) => ICON_SVGS[name] === undefined).map(([name, files]) => `${name} (${files[0]})`);
    expect(unmapped, 'icon names with no SVG in src/icons.ts').toEqual([]);
    const unused = Object.keys(ICON_SVGS).filter((name) => !names.has(name));
    expect(unused, 'SVGs in src/icons.ts no source names').toEqual([]);
    for (const svg of Object.values(ICON_SVGS)) expect(svg).toMatch(/^M[\d\s]/); // an SVG path (Quasar's 24×24 view box)
  });

  it('no longer loads the Material Icons font', () => {
    for (const file of [...sourceFiles(join(root, 'src')), join(root, 'index.html')].filter((f) => !f.endsWith('icons.test.ts'))) {
      expect(readFileSync(file, 'utf8'), relative(root, file)).not.toMatch(/material-icons\.css|Material\+Icons/);
    }
  });

  it('draws the app\'s icons as SVG paths, not ligature words', () => {
    const plugins = [[Quasar, quasarOptions]] as never;
    const badge = mount(AppLevelBadge, { props: { level: 'watch' }, global: { plugins } });
    expectSvgIcon(badge.element.querySelector('.q-icon'), matVisibility);
    expect(badge.text()).toBe('Watch');

    const open = mount(EventSection, { props: { id: 's', title: 'Findings', open: true }, global: { plugins } });
    expectSvgIcon(open.element.querySelector('.event-section__chevron'), matExpandLess);
    const folded = mount(EventSection, { props: { id: 's', title: 'Findings', open: false }, global: { plugins } });
    expectSvgIcon(folded.element.querySelector('.event-section__chevron'), matExpandMore);

    const btn = mount(() => h(QBtn, { icon: 'picture_as_pdf', label: 'PDF' }), { global: { plugins } });
    expectSvgIcon(btn.element.querySelector('.q-icon'), ICON_SVGS.picture_as_pdf);
    expect(btn.text()).toBe('PDF');
  });

  it("draws Quasar's own icons (a select's arrow) from the SVG icon set", () => {
    const select = mount(() => h(QSelect, { modelValue: null, options: ['a', 'b'], label: 'Pick' }), {
      global: { plugins: [[Quasar, quasarOptions]] as never },
    });
    expectSvgIcon(select.element.querySelector('.q-select__dropdown-icon'), matArrowDropDown);
  });
});
