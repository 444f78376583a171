import { mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { describe, expect, it } from 'vitest';
import AppLevelBadge from '../../../src/components/AppLevelBadge.vue';
import { LEVELS, type Level } from '../../../src/levels';

function render(level: Level) {
  return mount(AppLevelBadge, { props: { level }, global: { plugins: [Quasar] } });
}

describe('AppLevelBadge', () => {
  it.each([
    ['ok', 'OK', 'check_circle'],
    ['watch', 'Watch', 'visibility'],
    ['investigate', 'Investigate', 'warning'],
    ['critical', 'Critical', 'report'],
  ] as const)('shows level %s as the word "%s" with the %s icon, not colour alone', (level, word, icon) => {
    const wrapper = render(level);

    expect(wrapper.get('.app-level-badge__word').text()).toBe(word);
    expect(wrapper.get('.q-icon').text()).toBe(icon);
    expect(wrapper.classes()).toContain(`app-level-badge--${level}`);
    expect(wrapper.attributes('data-level')).toBe(level);
  });

  it('gives each level its own icon and word', () => {
    const shown = LEVELS.map((level) => {
      const wrapper = render(level);
      return { icon: wrapper.get('.q-icon').text(), word: wrapper.text() };
    });

    expect(new Set(shown.map((s) => s.icon)).size).toBe(LEVELS.length);
    expect(new Set(shown.map((s) => s.word)).size).toBe(LEVELS.length);
  });

  it('hides the icon from screen readers, which read the word', () => {
    const wrapper = render('critical');

    expect(wrapper.get('.q-icon').attributes('aria-hidden')).toBe('true');
  });
});
