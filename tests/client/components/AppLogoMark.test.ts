import { mount } from '@vue/test-utils';
import { describe, expect, it } from 'vitest';
import AppLogoMark from '../../../src/components/AppLogoMark.vue';

describe('AppLogoMark', () => {
  it('is decorative by default (the name "Gapsight" stands beside it)', () => {
    const svg = mount(AppLogoMark).get('svg');

    expect(svg.attributes('aria-hidden')).toBe('true');
    expect(svg.attributes('role')).toBeUndefined();
    expect(svg.find('title').exists()).toBe(false);
  });

  it('becomes an image with an accessible name when given a title', () => {
    const svg = mount(AppLogoMark, { props: { title: 'Gapsight' } }).get('svg');

    expect(svg.attributes('role')).toBe('img');
    expect(svg.attributes('aria-hidden')).toBeUndefined();
    expect(svg.get('title').text()).toBe('Gapsight');
  });

  it('draws at the size asked for', () => {
    const svg = mount(AppLogoMark, { props: { size: 56 } }).get('svg');

    expect(svg.attributes('width')).toBe('56');
    expect(svg.attributes('height')).toBe('56');
  });

  it('draws one winding turn out of line with the others — the deformation the product looks for', () => {
    const paths = mount(AppLogoMark).findAll('path');
    const tilted = paths.filter((path) => path.attributes('transform'));

    expect(paths.length).toBe(8); // four turns, back and front half each
    expect(tilted.length).toBe(2); // one turn, both halves
  });
});
