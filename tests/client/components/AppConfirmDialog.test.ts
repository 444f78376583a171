import { enableAutoUnmount, mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { afterEach, describe, expect, it } from 'vitest';
import AppConfirmDialog from '../../../src/components/AppConfirmDialog.vue';
import { settle } from '../helpers';

enableAutoUnmount(afterEach);

function open(props: Record<string, unknown> = {}) {
  return mount(AppConfirmDialog, {
    attachTo: document.body,
    props: { modelValue: true, title: 'Sign this decision?', confirmLabel: 'Sign the decision', ...props },
    slots: { default: '<p data-test="what">Hold on a go recommendation.</p>' },
    global: { plugins: [Quasar] },
  });
}

const inBody = (testId: string) => document.body.querySelector<HTMLElement>(`[data-test="${testId}"]`);

describe('AppConfirmDialog', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('shows the title, what will happen and a confirming button in words', async () => {
    open();
    await settle();

    expect(inBody('confirm-dialog')!.getAttribute('role')).toBe('alertdialog');
    expect(inBody('confirm-dialog')!.textContent).toContain('Sign this decision?');
    expect(inBody('what')!.textContent).toBe('Hold on a go recommendation.');
    expect(inBody('confirm-ok')!.textContent).toContain('Sign the decision');
  });

  it('emits confirm on the confirming button and asks to close on cancel', async () => {
    const wrapper = open();
    await settle();

    inBody('confirm-ok')!.click();
    inBody('confirm-cancel')!.click();
    await settle();
    expect(wrapper.emitted('confirm')).toHaveLength(1);
    expect(wrapper.emitted('update:modelValue')).toEqual([[false]]);
  });

  it('cannot be cancelled while the action runs', async () => {
    const wrapper = open({ loading: true });
    await settle();

    inBody('confirm-cancel')!.click();
    await settle();
    expect(wrapper.emitted('update:modelValue')).toBeUndefined();
  });
});
