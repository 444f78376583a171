import { mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { describe, expect, it } from 'vitest';
import AppCautions from '../../../src/components/AppCautions.vue';
import { CAUTIONS } from '../../../shared/screening/verdict';

describe('AppCautions', () => {
  it('shows every caution sentence of the engine, including the DC-test remanence one', () => {
    const wrapper = mount(AppCautions, { global: { plugins: [Quasar] } });

    const lines = wrapper.findAll('li').map((li) => li.text());
    expect(lines).toEqual([...CAUTIONS]);
    expect(lines.length).toBeGreaterThanOrEqual(5);
    expect(wrapper.text()).toContain('decision support for qualified staff');
    expect(wrapper.text()).toContain('A go cannot rule out deformation that the tests taken cannot see.');
    expect(wrapper.text()).toContain('DC tests (winding resistance) leave the core magnetised');
  });
});
