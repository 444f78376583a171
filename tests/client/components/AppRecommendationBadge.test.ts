import { mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { describe, expect, it } from 'vitest';
import AppRecommendationBadge from '../../../src/components/AppRecommendationBadge.vue';

describe('AppRecommendationBadge', () => {
  it.each([
    ['go', 'Go', 'check_circle'],
    ['conditional', 'Conditional', 'warning'],
    ['no-go', 'No-go', 'block'],
  ] as const)('shows %s as a word and a distinct icon, not colour alone', (recommendation, word, icon) => {
    const wrapper = mount(AppRecommendationBadge, { props: { recommendation }, global: { plugins: [Quasar] } });

    expect(wrapper.get('.q-icon').text()).toBe(icon);
    expect(wrapper.text().replace(icon, '')).toBe(word);
    expect(wrapper.classes()).toContain(`app-rec-badge--${recommendation}`);
  });
});
